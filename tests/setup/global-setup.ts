// One PostgreSQL cluster per test run, on its own port and data folder (never the development database).
// Migrations run once into a template database; each test file copies it.
import net from "node:net";
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

/** The first port from `start` that nothing listens on, so a cluster left running elsewhere never blocks a run. */
async function freePort(start: number): Promise<number> {
  for (let port = start; port < start + 50; port++) {
    const free = await new Promise<boolean>((resolve) => {
      const probe = net.createServer().once("error", () => resolve(false)).once("listening", () => probe.close(() => resolve(true)));
      probe.listen(port, "127.0.0.1");
    });
    if (free) return port;
  }
  throw new Error(`No free port for the test cluster from ${start}.`);
}

export default async function setup(project: TestProject) {
  const port = await freePort(Number(process.env.TEST_PGPORT ?? 54339));
  // The browser tests' setup runs after this one in the same process and reads the port from here.
  process.env.TEST_PGPORT = String(port);
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
