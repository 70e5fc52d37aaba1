// Dashboards on the generated fleet, each figure next to the bare SQL that fetches the same rows in the same run.
// Usage: tsx scripts/bench-dashboards.ts   (generates the fleet first when its database is missing)
import { readdirSync, readFileSync, existsSync } from "node:fs";
import path from "node:path";
import { Writable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { gzipSync } from "node:zlib";
import pg from "pg";
import { to as copyTo } from "pg-copy-streams";
import QueryStream from "pg-query-stream";
import { createDatabase } from "../app/lib/db.server";
import { csvLine } from "../app/lib/csv-cell";
import { FleetParamsSchema } from "../app/lib/fleet-params";
import { exportCells, exportRowsQuery } from "../app/queries/export.server";
import { listFleet } from "../app/queries/fleet-overview.server";
import { getInstrumentApi } from "../app/queries/instruments.server";
import { getViewer } from "../app/queries/people.server";
import { getInstrumentSeries } from "../app/queries/series.server";
import { generateFleet } from "./generate-fleet";
import { startCluster } from "./lib/postgres";

const port = Number(process.env.BENCH_PGPORT ?? 54349);
const cluster = startCluster({ dataDir: path.resolve(import.meta.dirname, "../.data/bench-postgres"), port, database: "postgres", log: () => {} });
const url = cluster.adminUrl.replace(/\/postgres$/, "/tareline_bench");
const probe = new pg.Client({ connectionString: cluster.adminUrl });
await probe.connect();
const exists = (await probe.query("select 1 from pg_database where datname = 'tareline_bench'")).rowCount;
await probe.end();
if (!exists || process.argv.includes("--regenerate")) {
  console.log("Generating the benchmark fleet (2,000 instruments, three years)…");
  await generateFleet(cluster.adminUrl);
}
const db = createDatabase(url, 4);
const viewer = (await getViewer(db, 1))!;
const now = new Date("2026-12-01T00:00:00Z");

async function timed(runs: number, fn: () => Promise<unknown>) {
  const samples: number[] = [];
  await fn();
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    samples.push(performance.now() - t);
  }
  samples.sort((a, b) => a - b);
  return { p50: samples[Math.floor(runs / 2)], max: samples[runs - 1] };
}
const ms = (v: number) => `${v.toFixed(1)} ms`;

const [{ id }] = (await db.$client.query<{ id: number }>("select id from instruments order by id limit 1 offset 7")).rows;
const instrument = await getInstrumentApi(db, viewer, id);
const series = await timed(20, () => getInstrumentSeries(db, instrument, "sensitivity", { from: null, to: now }, now));
const seriesSql = await timed(20, () => db.$client.query("select id, performed_at, result_g, outcome, tolerance_g from checks where instrument_id = $1 and check_type = 'sensitivity' order by performed_at", [id]));
console.log(`series, one instrument, three years (${(await db.$client.query("select count(*) from checks where instrument_id = $1 and check_type = 'sensitivity'", [id])).rows[0].count} points): p50 ${ms(series.p50)} vs bare SQL ${ms(seriesSql.p50)} (×${(series.p50 / seriesSql.p50).toFixed(1)}); target p50 < 50 ms`);

const params = FleetParamsSchema.parse({});
const fleet = await timed(10, () => listFleet(db, viewer, params, now));
const fleetSql = await timed(10, () => db.$client.query("select * from series_summaries s join instruments i on i.id = s.instrument_id"));
console.log(`fleet, ${(await listFleet(db, viewer, params, now)).length} instruments: p50 ${ms(fleet.p50)} vs bare SQL ${ms(fleetSql.p50)} (×${(fleet.p50 / fleetSql.p50).toFixed(1)}); target p50 < 300 ms`);

const exportParams = { type: "sensitivity" as const, from: "2025-07-19" };
const query = exportRowsQuery(viewer, exportParams);
const sink = () => new Writable({ write(_c, _e, cb) { cb(); } });
const client = await db.$client.connect();
let rows = 0;
let peak = 0;
const t0 = performance.now();
const stream = client.query(new QueryStream(query.text, query.values, { batchSize: 2000 }));
for await (const row of stream) {
  csvLine(exportCells(row as Record<string, unknown>));
  rows += 1;
  if ((rows & 0xffff) === 0) peak = Math.max(peak, process.memoryUsage().rss);
}
const exportSeconds = (performance.now() - t0) / 1000;
const t1 = performance.now();
// The same query with its values inlined, since COPY takes no parameters.
const literal = query.values.reduce<string>((text, v, i) => text.replaceAll(`$${i + 1}`, Array.isArray(v) ? `'{${v.join(",")}}'` : client.escapeLiteral(String(v))), query.text);
await pipeline(client.query(copyTo(`copy (${literal}) to stdout with csv`)), sink());
const copySeconds = (performance.now() - t1) / 1000;
client.release();
console.log(`export, ${rows.toLocaleString("en")} rows: ${Math.round(rows / exportSeconds).toLocaleString("en")} rows/s, peak RSS ${(peak / 2 ** 20).toFixed(0)} MB; raw COPY of the same query ${Math.round(rows / copySeconds).toLocaleString("en")} rows/s (ratio ${(copySeconds / exportSeconds).toFixed(2)}); target ≥ 100,000 rows/s, flat memory`);

const assets = path.resolve(import.meta.dirname, "../build/client/assets");
if (existsSync(assets)) {
  const files = readdirSync(assets).filter((f) => f.endsWith(".js"));
  const gz = (f: string) => gzipSync(readFileSync(path.join(assets, f))).length;
  const shared = files.filter((f) => /^(entry\.client|root|chunk|jsx-runtime|index)/.test(f)).reduce((n, f) => n + gz(f), 0);
  for (const page of ["instrument-detail", "fleet", "export", "instruments", "record-check"]) {
    const own = files.filter((f) => f.startsWith(`${page}-`)).reduce((n, f) => n + gz(f), 0);
    console.log(`JavaScript for /${page}: ${(own / 1024).toFixed(1)} KiB gzip of its own, plus ${(shared / 1024).toFixed(1)} KiB shared (entry, root, common chunks)`);
  }
} else {
  console.log("No build/client folder: run `npm run build` first to report the JavaScript each page ships.");
}
await db.$client.end();
cluster.stop();
