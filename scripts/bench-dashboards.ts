// `npm run bench:dashboards`: the dashboards on the generated 2,000-instrument fleet, measured end to end against
// the production build (HTTP with an API token, and time to first chart in headless Chromium), each figure next to
// its physical limit measured in the same run: the bare SQL that fetches the same rows, or a raw COPY.
// Usage: npm run bench:dashboards -- [--regenerate] [--no-build] [--port 3193] [--idp-port 5193] [--smtp-port 4193]
// BENCH_PGPORT (default 54349) is the fleet cluster's port; BUILD_DIR (default .data/bench-build-dashboards) the build.
import { rm } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import type { ReadableStream as WebStream } from "node:stream/web";
import { to as copyTo } from "pg-copy-streams";
import { createDatabase, type Database } from "../app/lib/db.server";
import type { Viewer } from "../app/lib/permissions";
import { exportRowsQuery } from "../app/queries/export.server";
import { createApiToken, getViewer, revokeApiToken } from "../app/queries/people.server";
import { pageWeights } from "./lib/bench-bundle";
import { launchBrowser, signIn, timeFirstChart, type LoadTiming } from "./lib/bench-first-chart";
import { countLines, get, inlineValues, mib, ms, sample, verdict, whole, withMemorySampling } from "./lib/bench-measure";
import { buildBundle, openFleet, startApp, Teardown } from "./lib/bench-stack";

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const root = path.resolve(import.meta.dirname, "..");
const ports = { app: arg("port", 3193), idp: arg("idp-port", 5193), smtp: arg("smtp-port", 4193) };
const buildDir = path.resolve(root, process.env.BUILD_DIR ?? ".data/bench-build-dashboards");
const work = path.join(root, `.data/bench-dashboards-${ports.app}`);
const shots = path.join(root, "test-results/bench");
const BENCH_EMAIL = "bench@bench.test";
const EXPORT_PATH = "/api/v1/export/checks.csv?type=sensitivity&from=2025-07-19";
const EXPORT_PARAMS = { type: "sensitivity" as const, from: "2025-07-19" };
/** Growth of the server's RSS during the export that still counts as flat: buffers, not a 190 MB file held whole. */
const FLAT_MEMORY_BYTES = 64 * 2 ** 20;

interface Bench {
  db: Database;
  baseUrl: string;
  serverPid: number;
  token: string;
  viewer: Viewer;
  instrumentId: number;
}

/** ×n: how many times the bare SQL's latency the endpoint takes. */
const times = (a: number, b: number) => `×${(a / b).toFixed(1)}`;

async function seriesFigure({ db, baseUrl, token, instrumentId }: Bench) {
  // range=all: the page's default is one year; the target is about the full three-year history.
  const url = `${baseUrl}/api/v1/instruments/${instrumentId}/series?type=sensitivity&range=all`;
  const points = ((await (await get(url, token)).json()) as { points: unknown[] }).points.length;
  // Warm-up long enough for V8 to optimise the route's code: a server answers thousands of these, not five.
  const http = await sample(50, 30, async () => (await get(url, token)).arrayBuffer());
  // The rows the endpoint's own query reads (see loadPoints), without the analysis or the JSON.
  const bare = await sample(30, 5, () => db.$client.query(
    `select c.id, c.performed_at, c.result_g, c.outcome, c.tolerance_g, c.acceptance_g, c.details, u.name as operator
     from checks c join users u on u.id = c.operator_id
     where c.instrument_id = $1 and c.check_type = 'sensitivity' and c.superseded_at is null order by c.performed_at, c.id`, [instrumentId]));
  console.log(`1. GET series, one instrument, three years (${points} points): p50 ${ms(http.p50)}, p95 ${ms(http.p95)} over ${http.runs} requests; bare SQL p50 ${ms(bare.p50)}, p95 ${ms(bare.p95)} (p50 ${times(http.p50, bare.p50)}); target p50 < 50 ms: ${verdict(http.p50 < 50)}`);
}

async function fleetFigure({ db, baseUrl, token }: Bench) {
  const url = `${baseUrl}/api/v1/fleet`;
  const rows = ((await (await get(url, token)).json()) as { rows: unknown[] }).rows.length;
  const http = await sample(15, 3, async () => (await get(url, token)).arrayBuffer());
  // One row per instrument with the summary of the check type the fleet shows by default, as the endpoint returns them.
  const bare = await sample(15, 3, () => db.$client.query("select * from instruments i left join series_summaries s on s.instrument_id = i.id and s.check_type = 'sensitivity'"));
  console.log(`2. GET fleet (${rows} instruments): p50 ${ms(http.p50)}, p95 ${ms(http.p95)} over ${http.runs} requests; bare SQL, instruments ⋈ their sensitivity summaries, p50 ${ms(bare.p50)}, p95 ${ms(bare.p95)} (p50 ${times(http.p50, bare.p50)}); target p50 < 300 ms: ${verdict(http.p50 < 300)}`);
}

/** The same query the route runs, straight out of PostgreSQL as CSV: as fast as these rows can leave the database. */
async function rawCopy({ db, viewer }: Bench): Promise<{ rows: number; seconds: number }> {
  const client = await db.$client.connect();
  try {
    const sql = `copy (${inlineValues(exportRowsQuery(viewer, EXPORT_PARAMS), (s) => client.escapeLiteral(s))}) to stdout with csv`;
    const t = performance.now();
    const { lines } = await countLines(client.query(copyTo(sql)));
    return { rows: lines, seconds: (performance.now() - t) / 1000 };
  } finally {
    client.release();
  }
}

async function exportFigure(bench: Bench) {
  const { baseUrl, token, serverPid } = bench;
  // Once first, so neither side pays for reading the table into the cache; the better of two COPYs is the limit.
  const copies = [await rawCopy(bench)];
  // identity: what is timed is the export, not the compression the served app would add for a browser.
  const http = await withMemorySampling(serverPid, async () => {
    const t = performance.now();
    const response = await get(`${baseUrl}${EXPORT_PATH}`, token, { "accept-encoding": "identity" });
    const { lines, bytes } = await countLines(Readable.fromWeb(response.body as WebStream<Uint8Array>));
    return { rows: lines - 1, bytes, seconds: (performance.now() - t) / 1000 };
  });
  copies.push(await rawCopy(bench));
  const copy = copies.reduce((a, b) => (a.seconds <= b.seconds ? a : b));
  const rate = http.result.rows / http.result.seconds;
  const copyRate = copy.rows / copy.seconds;
  console.log(`3. GET export/checks.csv (${whole(http.result.rows)} rows, ${mib(http.result.bytes)}): ${whole(rate)} rows/s in ${http.result.seconds.toFixed(1)} s; server RSS ${mib(http.before)} before, peak ${mib(http.peak)} during (+${mib(http.peak - http.before)}; VmHWM ${mib(http.hwmBefore)} → ${mib(http.hwmAfter)}); raw COPY ${whole(copyRate)} rows/s (${whole(copy.rows)} rows, endpoint at ${(rate / copyRate).toFixed(2)} of it); target ≥ 100,000 rows/s: ${verdict(rate >= 100_000)}, flat memory (growth < ${mib(FLAT_MEMORY_BYTES)}): ${verdict(http.peak - http.before < FLAT_MEMORY_BYTES)}`);
  if (copy.rows !== http.result.rows) console.log(`   note: the endpoint sent ${whole(http.result.rows)} rows, the raw COPY ${whole(copy.rows)}`);
}

function bundleFigure() {
  const routes = ["routes/instrument-detail", "routes/fleet", "routes/export", "routes/instruments", "routes/record-check"];
  const { shellBytes, shellFiles, pages } = pageWeights(buildDir, routes);
  const kib = (bytes: number) => `${(bytes / 1024).toFixed(1)} KiB`;
  console.log(`4. JavaScript per page (gzip, from ${path.relative(root, buildDir)}'s manifest); shell every signed-in page loads (entry, root, app layout): ${kib(shellBytes)} in ${shellFiles} files`);
  for (const p of pages) console.log(`   /${p.routeId.replace("routes/", "")}: ${kib(p.ownBytes)} of its own in ${p.ownFiles} files, ${kib(p.ownBytes + shellBytes)} with the shell`);
}

async function firstChartFigure(teardown: Teardown, { baseUrl, instrumentId }: Bench) {
  const browser = await launchBrowser();
  teardown.defer(() => browser.close());
  const state = await signIn(browser, baseUrl, BENCH_EMAIL);
  const pages = [
    // The page as it opens (one year). A plotted point of the control chart (outcome glyphs), inside the chart's
    // drawing: the legend's samples sit outside it, and the chart draws nothing until it has been measured.
    { name: "instrument", url: `${baseUrl}/instruments/${instrumentId}`, selector: 'figure [role="img"] svg :is(circle.fill-within, path.stroke-guard, g.stroke-out, circle.stroke-excluded)' },
    // The data line of the first small multiple, drawn once /api/v1/fleet/history has answered.
    { name: "fleet", url: `${baseUrl}/fleet`, selector: 'section[aria-labelledby="multiples-heading"] svg[role="img"] path[d^="M"]' },
  ];
  const describe = (t: LoadTiming) => `${ms(t.chart)} (HTML in at ${ms(t.html)}${t.fetchStart !== null ? `, API data fetched ${ms(t.fetchStart)} → ${ms(t.fetchEnd!)}` : ""})`;
  for (const p of pages) {
    const t = await timeFirstChart(browser, state, p.url, p.selector, { warmRuns: 5, screenshot: path.join(shots, `${p.name}.png`) });
    console.log(`5. First chart on ${new URL(p.url).pathname}: cold ${describe(t.cold)}; warm p50 over ${t.warmRuns} loads ${describe(t.warm)}; screenshot ${path.relative(root, shots)}/${p.name}.png`);
  }
}

const teardown = new Teardown();
try {
  const databaseUrl = await openFleet(teardown, { port: Number(process.env.BENCH_PGPORT ?? 54349), regenerate: process.argv.includes("--regenerate") });
  const db = createDatabase(databaseUrl, 4);
  teardown.defer(() => db.$client.end());
  const [{ id: userId }] = (await db.$client.query<{ id: number }>("select id from users where email = $1", [BENCH_EMAIL])).rows;
  const { token, secret } = await db.transaction((tx) => createApiToken(tx, { userId, name: "bench:dashboards", createdById: null }));
  teardown.defer(() => db.transaction((tx) => revokeApiToken(tx, { tokenId: token.id, actorId: userId })));
  if (!process.argv.includes("--no-build")) buildBundle(buildDir);
  await rm(work, { recursive: true, force: true });
  teardown.defer(() => rm(work, { recursive: true, force: true }));
  const app = await startApp(teardown, { databaseUrl, buildDir, ports, work });
  const [{ id: instrumentId }] = (await db.$client.query<{ id: number }>("select id from instruments order by id limit 1 offset 7")).rows;
  const viewer = (await getViewer(db, userId))!;
  const bench: Bench = { db, baseUrl: app.baseUrl, serverPid: app.pid, token: secret, viewer, instrumentId };
  console.log(`Production build on ${app.baseUrl} against tareline_bench; figures are indicative on a shared machine.`);
  await seriesFigure(bench);
  await fleetFigure(bench);
  await exportFigure(bench);
  bundleFigure();
  await firstChartFigure(teardown, bench);
} catch (error) {
  console.error(`bench:dashboards failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
  process.exitCode = 1;
} finally {
  await teardown.run();
}
