// `npm run bench:import`: a generated check-history CSV (1,000,000 rows by default) imported end to end through
// the same functions the upload and start routes call, next to `psql \copy` of the same file into a bare table
// in the same run and cluster (the physical limit). Prints rows per second, the ratio and the peak RSS.
// Usage: npm run bench:import -- [--rows 1000000] [--port 54391]
import { spawnSync } from "node:child_process";
import { createReadStream } from "node:fs";
import { mkdir, rm, stat } from "node:fs/promises";
import path from "node:path";
import { count, desc, eq } from "drizzle-orm";
import { createDatabase } from "../app/lib/db.server";
import { suggestMapping } from "../app/lib/csv-mapping";
import { readStoredImport } from "../app/lib/csv-import-record";
import { startImport, waitForImport } from "../app/queries/imports-job.server";
import { receiveUpload } from "../app/queries/imports-upload.server";
import { getViewer } from "../app/queries/people.server";
import { checks, importRowsRejected, imports, users } from "../db/schema";
import { DEMO_PEOPLE } from "../db/seed/people";
import { seedDemo } from "../db/seed/seed";
import { ensureDatabase, runMigrations } from "./lib/database";
import { loadTargets, writeCheckCsv } from "./lib/generate-check-csv";
import { removeCluster, startCluster } from "./lib/postgres";

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const ROWS = arg("rows", 1_000_000);
const PORT = arg("port", 54391);
const root = path.resolve(import.meta.dirname, "..");
const work = path.join(root, `.data/bench-import-${PORT}`);
const csv = path.join(work, "check-history.csv");
const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;
const perSecond = (rows: number, ms: number) => Math.round(rows / (ms / 1000));

let peakRss = 0;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);

await rm(work, { recursive: true, force: true });
await mkdir(work, { recursive: true });
process.env.PG_FSYNC = "off";
const cluster = startCluster({ dataDir: path.join(work, "postgres"), port: PORT, database: "tareline_bench", log: () => {} });
try {
  await ensureDatabase(cluster.adminUrl, "tareline_bench");
  await runMigrations(cluster.url);
  const db = createDatabase(cluster.url, 10);
  await seedDemo(db);
  const admin = DEMO_PEOPLE.find((p) => p.role === "admin")!;
  const [adminRow] = await db.select().from(users).where(eq(users.email, admin.email));
  const viewer = (await getViewer(db, adminRow.id))!;

  const targets = await loadTargets(db);
  const generated = await writeCheckCsv(csv, { rows: ROWS, targets, from: new Date("2024-12-02T06:00:00Z"), to: new Date("2026-11-25T18:00:00Z") });
  console.log(`Generated ${generated.rows.toLocaleString("en-GB")} rows (${mb(generated.bytes)}) over ${targets.length} instrument × check-type series.`);

  const psqlUrl = cluster.url;
  spawnSync("psql", [psqlUrl, "-qc", "CREATE TABLE bare (asset_tag text, check_type text, performed_at text, unit text, weight text, readings text, operator_email text, note text)"], { stdio: "inherit" });
  const copyStart = performance.now();
  const copied = spawnSync("psql", [psqlUrl, "-qc", `\\copy bare FROM '${csv}' WITH (FORMAT csv, HEADER true)`], { stdio: "inherit" });
  const copyMs = performance.now() - copyStart;
  if (copied.status !== 0) throw new Error("psql \\copy failed");

  const rssBefore = process.memoryUsage().rss;
  peakRss = rssBefore;
  const t0 = performance.now();
  const id = await receiveUpload(db, viewer, { filename: "check-history.csv", body: createReadStream(csv) });
  const uploadMs = performance.now() - t0;
  const [row] = await db.select().from(imports).where(eq(imports.id, id));
  const file = readStoredImport(row.mapping).file!;
  await startImport(db, viewer, id, { mapping: suggestMapping(file.labels), unit: "g", timeZone: "site", mode: "all_or_nothing", delimiter: file.delimiter, encoding: file.encoding });
  let validatedMs = 0;
  const watch = setInterval(async () => {
    const [r] = await db.select({ status: imports.status }).from(imports).where(eq(imports.id, id));
    if (!validatedMs && r.status === "importing") validatedMs = performance.now() - t0;
  }, 100);
  await waitForImport(id);
  clearInterval(watch);
  const importMs = performance.now() - t0;
  const [done] = await db.select().from(imports).where(eq(imports.id, id));
  const [{ n }] = await db.select({ n: count() }).from(checks).where(eq(checks.importId, id));
  const reasons = await db.select({ reason: importRowsRejected.reason, n: count() }).from(importRowsRejected).where(eq(importRowsRejected.importId, id)).groupBy(importRowsRejected.reason).orderBy(desc(count())).limit(5);
  await db.$client.end();

  const copyRate = perSecond(ROWS, copyMs);
  const importRate = perSecond(ROWS, importMs);
  console.log(`\n${"".padEnd(34)}      seconds     rows/s`);
  console.log(`psql \\copy into a bare table     ${(copyMs / 1000).toFixed(2).padStart(10)} ${copyRate.toLocaleString("en-GB").padStart(10)}`);
  console.log(`Tareline import, end to end      ${(importMs / 1000).toFixed(2).padStart(10)} ${importRate.toLocaleString("en-GB").padStart(10)}`);
  console.log(`  upload to .data/uploads        ${(uploadMs / 1000).toFixed(2).padStart(10)}`);
  console.log(`  read, judge, COPY to stage     ${((validatedMs - uploadMs) / 1000).toFixed(2).padStart(10)}`);
  console.log(`  duplicates, insert, series     ${((importMs - validatedMs) / 1000).toFixed(2).padStart(10)}`);
  console.log(`\nImport status ${done.status}: ${n.toLocaleString("en-GB")} checks written, ${done.rejectedRows} rejected, ${done.duplicateRows} duplicates.`);
  for (const r of reasons) console.log(`  rejected ${r.n}×: ${r.reason}`);
  console.log(`Import rate / raw COPY rate: ${(importRate / copyRate).toFixed(3)} (target ≥ 0.333)`);
  console.log(`Peak RSS of this process during the import: ${mb(peakRss)} (before it: ${mb(rssBefore)}; target < 300 MB)`);
  console.log(`File: ${mb((await stat(csv)).size)}`);
} finally {
  clearInterval(sampler);
  cluster.stop();
  removeCluster(path.join(work, "postgres"));
  await rm(work, { recursive: true, force: true });
}
