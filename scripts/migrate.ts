// Applies db/migrations to DATABASE_URL; exits non-zero on any failure.
import { runMigrations } from "./lib/database";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("DATABASE_URL is not set.");
  process.exit(2);
}
try {
  await runMigrations(url);
  console.log("Migrations applied.");
} catch (error) {
  console.error("Migration failed:", error instanceof Error ? error.message : error);
  process.exit(1);
}
