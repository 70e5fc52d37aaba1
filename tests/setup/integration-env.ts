// Runs before each integration test file: a private copy of the seeded template, and the app's environment.
import { randomBytes } from "node:crypto";
import { inject } from "vitest";
import { ensureDatabase } from "../../scripts/lib/database";

const adminUrl = inject("pgAdminUrl");
const name = `test_${randomBytes(6).toString("hex")}`;
await ensureDatabase(adminUrl, name, "tareline_template");
Object.assign(process.env, {
  NODE_ENV: "test",
  DATABASE_URL: adminUrl.replace(/\/postgres$/, `/${name}`),
  SESSION_SECRET: "integration-tests-session-secret",
  APP_URL: "http://localhost:3999",
  OIDC_ISSUER: "http://127.0.0.1:9499",
  OIDC_CLIENT_ID: "tareline-test",
  OIDC_CLIENT_SECRET: "tareline-test-secret",
  OIDC_REDIRECT_URI: "http://localhost:3999/auth/callback",
  // A port per test file; files that check mail start the SMTP fake on it (tests/helpers/mail.ts).
  SMTP_URL: `smtp://127.0.0.1:${20000 + Math.floor(Math.random() * 20000)}`,
});
