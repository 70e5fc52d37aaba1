// `npm run bench:import`: a generated check-history CSV (1,000,000 rows by default) imported end to end through
// the same functions the upload and start routes call (in a process of its own, scripts/lib/bench-import-run.ts),
// next to `psql \copy` of the same file into a bare table in the same run and cluster (the physical limit).
// Prints rows per second, the ratio and the importing process's peak RSS.
// Usage: npm run bench:import -- [--rows 1000000] [--port 54391]
import { spawnSync } from "node:child_process";
import { mkdir, rm, stat } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { createDatabase } from "../app/lib/db.server";
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

const ImportRunSchema = z.object({
  uploadMs: z.number(),
  validatedMs: z.number(),
  importMs: z.number(),
  status: z.string(),
  written: z.number(),
  rejected: z.number(),
  duplicates: z.number(),
  reasons: z.array(z.object({ reason: z.string(), n: z.number() })),
  rssBefore: z.number(),
  peakReading: z.number(),
  peakWriting: z.number(),
  maxRss: z.number(),
});

await rm(work, { recursive: true, force: true });
await mkdir(work, { recursive: true });
process.env.PG_FSYNC = "off";
const cluster = startCluster({ dataDir: path.join(work, "postgres"), port: PORT, database: "tareline_bench", log: () => {} });
try {
  await ensureDatabase(cluster.adminUrl, "tareline_bench");
  await runMigrations(cluster.url);
  const db = createDatabase(cluster.url, 10);
  await seedDemo(db);

  const targets = await loadTargets(db);
  const generated = await writeCheckCsv(csv, { rows: ROWS, targets, from: new Date("2024-12-02T06:00:00Z"), to: new Date("2026-11-25T18:00:00Z") });
  console.log(`Generated ${generated.rows.toLocaleString("en-GB")} rows (${mb(generated.bytes)}) over ${targets.length} instrument × check-type series.`);

  const psqlUrl = cluster.url;
  spawnSync("psql", [psqlUrl, "-qc", "CREATE TABLE bare (asset_tag text, check_type text, performed_at text, unit text, weight text, readings text, operator_email text, note text)"], { stdio: "inherit" });
  const copyStart = performance.now();
  const copied = spawnSync("psql", [psqlUrl, "-qc", `\\copy bare FROM '${csv}' WITH (FORMAT csv, HEADER true)`], { stdio: "inherit" });
  const copyMs = performance.now() - copyStart;
  if (copied.status !== 0) throw new Error("psql \\copy failed");

  await db.$client.end();

  const child = spawnSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), path.join(root, "scripts/lib/bench-import-run.ts"), cluster.url, csv], { cwd: root, encoding: "utf8", stdio: ["ignore", "pipe", "inherit"], maxBuffer: 1 << 20 });
  if (child.status !== 0) throw new Error("The import run failed; see above.");
  const run = ImportRunSchema.parse(JSON.parse(child.stdout.trim().split("\n").at(-1) ?? "{}"));
  const { uploadMs, validatedMs, importMs } = run;

  const copyRate = perSecond(ROWS, copyMs);
  const importRate = perSecond(ROWS, importMs);
  console.log(`\n${"".padEnd(34)}      seconds     rows/s`);
  console.log(`psql \\copy into a bare table     ${(copyMs / 1000).toFixed(2).padStart(10)} ${copyRate.toLocaleString("en-GB").padStart(10)}`);
  console.log(`Tareline import, end to end      ${(importMs / 1000).toFixed(2).padStart(10)} ${importRate.toLocaleString("en-GB").padStart(10)}`);
  console.log(`  upload to .data/uploads        ${(uploadMs / 1000).toFixed(2).padStart(10)}`);
  console.log(`  read, judge, COPY to stage     ${((validatedMs - uploadMs) / 1000).toFixed(2).padStart(10)}`);
  console.log(`  duplicates, insert, series     ${((importMs - validatedMs) / 1000).toFixed(2).padStart(10)}`);
  console.log(`\nImport status ${run.status}: ${run.written.toLocaleString("en-GB")} checks written, ${run.rejected} rejected, ${run.duplicates} duplicates.`);
  for (const r of run.reasons) console.log(`  reported ${r.n}×: ${r.reason}`);
  console.log(`Import rate / raw COPY rate: ${(importRate / copyRate).toFixed(3)} (target ≥ 0.333)`);
  console.log(`Peak RSS of the importing process: ${mb(run.maxRss)} (${mb(run.rssBefore)} once its modules were loaded; ${mb(run.peakReading)} while reading, ${mb(run.peakWriting)} while writing; target < 300 MB)`);
  console.log(`File: ${mb((await stat(csv)).size)}`);
} finally {
  cluster.stop();
  removeCluster(path.join(work, "postgres"));
  await rm(work, { recursive: true, force: true });
}
