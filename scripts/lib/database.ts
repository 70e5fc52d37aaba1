import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import path from "node:path";
import pg from "pg";

export const MIGRATIONS_FOLDER = path.resolve(import.meta.dirname, "../../db/migrations");

/** Creates `name` unless it exists, optionally as a copy of `template` (a fast file-level copy). */
export async function ensureDatabase(adminUrl: string, name: string, template?: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const found = await client.query("select 1 from pg_database where datname = $1", [name]);
    if (found.rowCount) return false;
    const ident = (s: string) => `"${s.replaceAll('"', '""')}"`;
    await client.query(`create database ${ident(name)}${template ? ` template ${ident(template)}` : ""}`);
    return true;
  } finally {
    await client.end();
  }
}

export async function dropDatabase(adminUrl: string, name: string): Promise<void> {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`drop database if exists "${name.replaceAll('"', '""')}" with (force)`);
  } finally {
    await client.end();
  }
}

/** Applies the committed migrations; throws (never logs and carries on) on the first failure. */
export async function runMigrations(url: string): Promise<void> {
  const pool = new pg.Pool({ connectionString: url, max: 1 });
  try {
    await migrate(drizzle({ client: pool }), { migrationsFolder: MIGRATIONS_FOLDER });
  } finally {
    await pool.end();
  }
}
