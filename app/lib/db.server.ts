import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "../../db/schema";
import { env } from "./env.server";

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Transaction = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type DbOrTx = Database | Transaction;

declare global {
  var __tarelineDb: Database | undefined;
}

export function createDatabase(url: string, max = 10): Database {
  const pool = new pg.Pool({ connectionString: url, max });
  return drizzle({ client: pool, schema, casing: "snake_case" });
}

/** One pool per process; kept on globalThis so dev-server reloads do not leak connections. */
export function db(): Database {
  globalThis.__tarelineDb ??= createDatabase(env().DATABASE_URL);
  return globalThis.__tarelineDb;
}
