// The environment the app is started with in development and tests (production sets its own).
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

export function sessionSecret(dataDir: string): string {
  const file = path.join(dataDir, "session-secret");
  if (existsSync(file)) return readFileSync(file, "utf8").trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString("hex");
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

export function appEnvironment(options: { databaseUrl: string; appPort: number; idpPort: number; smtpPort: number; secret: string; outbox: string }) {
  const appUrl = `http://localhost:${options.appPort}`;
  return {
    NODE_ENV: "production",
    PORT: String(options.appPort),
    DATABASE_URL: options.databaseUrl,
    SESSION_SECRET: options.secret,
    APP_URL: appUrl,
    OIDC_ISSUER: `http://127.0.0.1:${options.idpPort}`,
    OIDC_CLIENT_ID: "tareline-dev",
    OIDC_CLIENT_SECRET: "tareline-dev-secret",
    OIDC_REDIRECT_URI: `${appUrl}/auth/callback`,
    SMTP_URL: `smtp://127.0.0.1:${options.smtpPort}`,
    OUTBOX_DIR: options.outbox,
    DEMO_SIGN_IN: "true",
  };
}
