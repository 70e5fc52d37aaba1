import { z } from "zod";

// Validated once at start-up: a missing setting stops the server with a readable message.
const EnvSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().url(),
  SESSION_SECRET: z.string().min(16),
  APP_URL: z.string().url().default("http://localhost:3000"),
  OIDC_ISSUER: z.string().url(),
  OIDC_CLIENT_ID: z.string().min(1),
  OIDC_CLIENT_SECRET: z.string().min(1),
  OIDC_REDIRECT_URI: z.string().url(),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  MAIL_FROM: z.string().default("Tareline <no-reply@tareline.invalid>"),
  // Development only: where the SMTP fake writes messages, listed on /outbox.
  OUTBOX_DIR: z.string().optional(),
  // Shows the demo people on the sign-in page; never set in production.
  DEMO_SIGN_IN: z.enum(["true", "false"]).default("false"),
});

export type Env = z.infer<typeof EnvSchema>;

let cached: Env | undefined;

export function env(): Env {
  if (cached) return cached;
  const parsed = EnvSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Invalid environment:\n${lines}\nSee .env.example.`);
  }
  cached = parsed.data;
  return cached;
}
