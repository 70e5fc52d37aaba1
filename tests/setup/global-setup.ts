// One PostgreSQL cluster per test run, on its own port and data folder (never the development database).
// Migrations run once into a template database; each test file copies it.
import path from "node:path";
import type { TestProject } from "vitest/node";
import { createDatabase } from "../../app/lib/db.server";
import { seedDemo } from "../../db/seed/seed";
import { ensureDatabase, runMigrations } from "../../scripts/lib/database";
import { removeCluster, startCluster } from "../../scripts/lib/postgres";

declare module "vitest" {
  export interface ProvidedContext {
    pgAdminUrl: string;
    pgPort: number;
  }
}

export const TEMPLATE_DATABASE = "tareline_template";
export const EMPTY_TEMPLATE_DATABASE = "tareline_empty";

export default async function setup(project: TestProject) {
  const port = Number(process.env.TEST_PGPORT ?? 54339);
  // The folder follows the port, so two test runs on different ports never share a cluster.
  const dataDir = path.resolve(import.meta.dirname, `../../.data/test-postgres-${port}`);
  const first = startCluster({ dataDir, port, database: "postgres", log: () => {} });
  // A fresh cluster per run: stop and remove whatever an interrupted run left behind.
  first.stop();
  removeCluster(first.dataDir);
  process.env.PG_FSYNC = "off";
  const cluster = startCluster({ dataDir, port, database: "postgres", log: () => {} });
  await ensureDatabase(cluster.adminUrl, EMPTY_TEMPLATE_DATABASE);
  await ensureDatabase(cluster.adminUrl, TEMPLATE_DATABASE);
  const templateUrl = cluster.adminUrl.replace(/\/postgres$/, `/${TEMPLATE_DATABASE}`);
  await runMigrations(templateUrl);
  const db = createDatabase(templateUrl, 1);
  await seedDemo(db);
  await db.$client.end();
  project.provide("pgAdminUrl", cluster.adminUrl);
  project.provide("pgPort", port);
  return () => {
    cluster.stop();
    removeCluster(cluster.dataDir);
  };
}
