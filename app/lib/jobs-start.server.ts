// Starts the job queue once per server process (never in tests, which start their own); TARELINE_JOBS=off disables it.
import { env } from "./env.server";
import { startJobs, type Jobs } from "./jobs.server";
import { sendMail } from "./mail.server";

declare global {
  var __tarelineJobs: Promise<Jobs | null> | undefined;
}

export function ensureJobsStarted(): Promise<Jobs | null> {
  if (process.env.TARELINE_JOBS === "off" || env().NODE_ENV === "test") return Promise.resolve(null);
  globalThis.__tarelineJobs ??= startJobs({ databaseUrl: env().DATABASE_URL, appUrl: env().APP_URL, send: sendMail }).catch((error: unknown) => {
    console.error("The job queue did not start; digests and reminders wait for the next start:", error instanceof Error ? error.message : error);
    globalThis.__tarelineJobs = undefined;
    return null;
  });
  return globalThis.__tarelineJobs;
}
