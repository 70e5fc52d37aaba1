// Builds a large synthetic fleet for benchmarks into its own database (never the demo one): 2,000 instruments,
// three years of daily sensitivity, weekly repeatability and monthly eccentricity checks, loaded with COPY.
// Usage: tsx scripts/generate-fleet.ts [--instruments 2000] [--database tareline_bench]
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { Readable } from "node:stream";
import pg from "pg";
import { from as copyFrom } from "pg-copy-streams";
import { createDatabase } from "../app/lib/db.server";
import { refreshSeriesSummary } from "../app/queries/series-summary.server";
import { normal, seededRandom } from "../db/seed/random";
import { dropDatabase, ensureDatabase, runMigrations } from "./lib/database";
import { startCluster } from "./lib/postgres";

const arg = (name: string, fallback: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const COUNT = Number(arg("instruments", "2000"));
const DATABASE = arg("database", "tareline_bench");
const DAY = 86_400_000;
const END = Date.parse("2026-11-30T08:00:00Z");
const DAYS = 3 * 365;

export async function generateFleet(adminUrl: string) {
  await dropDatabase(adminUrl, DATABASE);
  await ensureDatabase(adminUrl, DATABASE);
  const url = adminUrl.replace(/\/postgres$/, `/${DATABASE}`);
  await runMigrations(url);
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  await client.query(`insert into sites (code, name, time_zone) values ('BEN', 'Benchmark site', 'Europe/Berlin')`);
  await client.query(`insert into users (email, name) values ('bench@bench.test', 'Bench operator')`);
  await client.query(`insert into memberships (user_id, site_id, role) select u.id, s.id, 'admin' from users u, sites s`);
  await client.query(`insert into instruments (site_id, asset_tag, kind, capacity_g, readability_g, verification_interval_g, accuracy_class, smallest_net_weight_g)
    select 1, 'BEN-' || lpad(g::text, 5, '0'), 'analytical_balance', 220, 0.0001, 0.001, 'I', 0.5 from generate_series(1, ${COUNT}) g`);
  await client.query(`insert into check_plans (instrument_id, check_type, interval_days, tolerance_basis, tolerance_value)
    select i.id, t.type::check_type, t.days, 'absolute', t.tol from instruments i,
    (values ('sensitivity', 1, 0.001), ('repeatability', 7, 0.00025), ('eccentricity', 30, 0.002)) as t(type, days, tol)`);
  const random = seededRandom(42);
  const plans = (await client.query<{ id: number; instrument_id: number; check_type: string }>("select id, instrument_id, check_type from check_plans order by id")).rows;
  function* lines() {
    for (const plan of plans) {
      const step = plan.check_type === "sensitivity" ? 1 : plan.check_type === "repeatability" ? 7 : 30;
      const tol = plan.check_type === "sensitivity" ? 0.001 : plan.check_type === "repeatability" ? 0.00025 : 0.002;
      const drift = random() < 0.05 ? 0.0000015 * random() : 0;
      let chunk = "";
      for (let ago = DAYS; ago >= 0; ago -= step) {
        const at = new Date(END - ago * DAY).toISOString();
        const base = plan.check_type === "sensitivity" ? 0.00008 * normal(random) + drift * (DAYS - ago) : Math.abs(0.00005 + 0.00001 * normal(random));
        const outcome = Math.abs(base) <= (2 / 3) * tol ? "in_tolerance" : Math.abs(base) <= tol ? "guard_band" : "out_of_tolerance";
        // One reading per check, the 200 g load plus the error, as a balance with d = 0.1 mg shows it.
        const reading = (200 + base).toFixed(4);
        chunk += `${plan.instrument_id}\t${plan.check_type}\t${plan.id}\t1\t${at}\tg\t${base}\t${tol}\t${(2 / 3) * tol}\t${outcome}\timport\t${reading}\n`;
      }
      yield chunk;
    }
  }
  await pipeline(Readable.from(lines()), client.query(copyFrom("copy checks (instrument_id, check_type, plan_id, operator_id, performed_at, unit, result_g, tolerance_g, acceptance_g, outcome, source, readings_entered) from stdin")));
  // The readings rows from the same text the checks carry, so the two can never disagree.
  await client.query("insert into check_readings (check_id, ordinal, value) select id, 1, readings_entered::numeric from checks");
  await client.query("analyze");
  await client.end();
  const db = createDatabase(url, 2);
  for (const plan of plans) await refreshSeriesSummary(db, plan.instrument_id, plan.check_type as "sensitivity", new Date(END));
  const [{ n }] = (await db.$client.query<{ n: string }>("select count(*) as n from checks")).rows;
  await db.$client.end();
  return { url, checks: Number(n) };
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith("generate-fleet.ts")) {
  const port = Number(process.env.BENCH_PGPORT ?? 54349);
  const cluster = startCluster({ dataDir: path.resolve(import.meta.dirname, "../.data/bench-postgres"), port, database: "postgres", log: console.log });
  const started = performance.now();
  const { checks } = await generateFleet(cluster.adminUrl);
  console.log(`Generated ${COUNT} instruments and ${checks.toLocaleString("en")} checks into ${DATABASE} in ${((performance.now() - started) / 1000).toFixed(1)} s (cluster on 127.0.0.1:${port}).`);
}
