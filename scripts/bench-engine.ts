// Engine benchmark: full series analysis (run rules, EWMA, CUSUM, trend, forecast) of a fleet of seeded synthetic
// series, in one process. Usage: npx tsx scripts/bench-engine.ts [--series 2000] [--points 1100] [--threads 2] [--iso] [--warmup 0]
// Times go in as epoch milliseconds (the bulk path); --iso passes ISO strings instead, as the API does.
// The clock starts cold, as a one-off fleet job would; --warmup N first analyzes N other series on each thread
// (not timed), which shows the steady state of a long-running process once the compiler has done its work.
import { availableParallelism } from "node:os";
import { isMainThread, parentPort, Worker, workerData } from "node:worker_threads";
import { analyzeSeries } from "../app/lib/stats/analyze";
import { theilSenAndMannKendall } from "../app/lib/stats/theil-sen";
import { daysSinceFirstMs } from "../app/lib/stats/time-axis";

interface Job {
  first: number;
  count: number;
  points: number;
  iso: boolean;
  warmup: number;
}

const DAY_MS = 86_400_000;
const START = Date.UTC(2024, 0, 8, 7, 30);
const READABILITY = 0.0001;

/** mulberry32: a small, fast, seeded generator; the same seed always builds the same fleet. */
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Check times shared by the fleet (daily, at a random minute of the morning): one array keeps the heap small. */
function buildTimes(points: number): { ms: Float64Array; iso: string[] } {
  const random = generator(0x51ed);
  const ms = Float64Array.from({ length: points }, (_, i) => START + i * DAY_MS + Math.floor(random() * 3_600_000));
  return { ms, iso: Array.from(ms, (t) => new Date(t).toISOString()) };
}

/** Series i: a 100 g sensitivity check read to 0.1 mg, daily, some drifting, some with a step after a repair. */
function buildValues(index: number, points: number): number[] {
  const random = generator(0x7a4e11 + index);
  const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const drift = random() < 0.15 ? (random() - 0.5) * 4e-6 : 0;
  const stepAt = random() < 0.1 ? Math.floor(random() * points) : -1;
  const sd = 0.0001 + random() * 0.0003;
  const values: number[] = new Array(points);
  for (let i = 0; i < points; i++) {
    const value = 100 + drift * i + (stepAt >= 0 && i >= stepAt ? 3 * sd : 0) + sd * normal();
    values[i] = Math.round(value / READABILITY) * READABILITY;
  }
  return values;
}

interface Fleet {
  times: { ms: Float64Array; iso: string[] };
  values: number[][];
  iso: boolean;
}

function buildShare(job: Job): Fleet {
  return { times: buildTimes(job.points), values: Array.from({ length: job.count }, (_, k) => buildValues(job.first + k, job.points)), iso: job.iso };
}

/** Series from seeds the fleet never uses, analysed before the clock starts when --warmup is given. */
function warmUp(job: Job): void {
  if (job.warmup > 0) analyzeShare({ ...buildShare({ ...job, first: 1_000_000 + job.first, count: job.warmup }) });
}

interface EngineResult {
  engineMs: number;
  /** Process CPU time during the engine loop (all threads, the collector's helpers too): other load on the machine moves it less than wall time. */
  engineCpuMs: number;
  signals: number;
  /** Sum of the trend figures: equal sums across code changes say the published results did not move. */
  trendSum: number;
}

interface ExtraResult {
  robustTrendMs: number;
  sumMs: number;
  checksum: number;
}

function analyzeShare({ times, values, iso }: Fleet): EngineResult {
  const tolerance = { upper: 100.1, lower: 99.9, guardBand: 0.1 / 3 };
  const started = performance.now();
  const cpuBefore = process.cpuUsage();
  let signals = 0;
  let trendSum = 0;
  for (const series of values) {
    const input = iso ? { values: series, times: times.iso } : { values: series, timesMs: times.ms };
    const result = analyzeSeries({ ...input, resolution: READABILITY, tolerance });
    signals += result.signals.length;
    if (result.trend) trendSum += result.trend.slope + result.trend.pValue + result.trend.theilSen * 1e6 + result.trend.mannKendallP;
  }
  const engineMs = performance.now() - started;
  const cpu = process.cpuUsage(cpuBefore);
  return { engineMs, engineCpuMs: (cpu.user + cpu.system) / 1000, signals, trendSum };
}

/** The share of the robust statistics (Theil–Sen with Mann–Kendall), and a plain loop summing the same arrays. */
function extraTimings({ times, values }: Fleet): ExtraResult {
  const axis = daysSinceFirstMs(times.ms);
  const robustStarted = performance.now();
  let slopeSum = 0;
  for (const series of values) slopeSum += theilSenAndMannKendall(axis, series).theilSen;
  const robustTrendMs = performance.now() - robustStarted;
  const sumStarted = performance.now();
  let checksum = 0;
  for (const series of values) for (let i = 0; i < series.length; i++) checksum += series[i];
  return { robustTrendMs, sumMs: performance.now() - sumStarted, checksum: checksum + 0 * slopeSum };
}

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

/** Workers do not inherit tsx's loader: a tiny ES module registers it, then loads this file. */
function workerEntry(): URL {
  const register = JSON.stringify(import.meta.resolve("tsx/esm/api"));
  const code = `import { register } from ${register}; register(); await import(${JSON.stringify(import.meta.url)});`;
  return new URL(`data:text/javascript,${encodeURIComponent(code)}`);
}

function ask<T>(worker: Worker, message: string): Promise<T> {
  return new Promise((resolve) => {
    worker.once("message", resolve);
    worker.postMessage(message);
  });
}

async function main(): Promise<void> {
  const seriesCount = option("series", 2000);
  const points = option("points", 1100);
  const iso = process.argv.includes("--iso");
  const warmup = option("warmup", 0);
  const threads = Math.max(1, Math.min(option("threads", 2), availableParallelism()));
  const share = Math.ceil(seriesCount / threads);
  const jobs: Job[] = Array.from({ length: threads }, (_, t) => ({ first: t * share, count: Math.max(0, Math.min(share, seriesCount - t * share)), points, iso, warmup }));
  if (threads === 1) {
    const fleet = buildShare(jobs[0]);
    warmUp(jobs[0]);
    const started = performance.now();
    const engine = analyzeShare(fleet);
    const wallMs = performance.now() - started;
    return report([engine], [extraTimings(fleet)], { seriesCount, points, threads, iso, warmup, wallMs });
  }
  const ready: Promise<void>[] = [];
  const workers = jobs.map((job) => {
    const worker = new Worker(workerEntry(), { workerData: job });
    ready.push(new Promise((resolve) => worker.once("message", () => resolve())));
    return worker;
  });
  await Promise.all(ready);
  const started = performance.now();
  const engines = await Promise.all(workers.map((worker) => ask<EngineResult>(worker, "engine")));
  const wallMs = performance.now() - started;
  const extras = await Promise.all(workers.map((worker) => ask<ExtraResult>(worker, "extras")));
  await Promise.all(workers.map((worker) => worker.terminate()));
  report(engines, extras, { seriesCount, points, threads, iso, warmup, wallMs });
}

interface Run {
  seriesCount: number;
  points: number;
  threads: number;
  iso: boolean;
  warmup: number;
  /** Start signal to the last engine result: the figure the target is about. */
  wallMs: number;
}

function report(engines: EngineResult[], extras: ExtraResult[], run: Run): void {
  const { seriesCount, points, threads, wallMs } = run;
  const totalPoints = seriesCount * points;
  const slowest = (values: number[]) => Math.max(...values);
  const sumMs = slowest(extras.map((r) => r.sumMs));
  const rssMb = process.resourceUsage().maxRSS / 1024;
  const start = run.warmup > 0 ? `warm (after ${run.warmup} other series per thread)` : "cold";
  console.log(`series ${seriesCount} × points ${points} = ${totalPoints.toLocaleString("en-GB")} points on ${threads} thread(s), times as ${run.iso ? "ISO strings" : "epoch ms"}, ${start}`);
  console.log(`wall time, start signal to last engine result: ${wallMs.toFixed(0)} ms, ${(totalPoints / (wallMs / 1000) / 1e6).toFixed(2)} M points/s`);
  console.log(`engine loop per thread: ${engines.map((r) => r.engineMs.toFixed(0)).join(" / ")} ms`);
  if (threads === 1) console.log(`  CPU time of that loop: ${engines[0].engineCpuMs.toFixed(0)} ms (wall time stretches when other work shares the cores)`);
  console.log(`  of which Theil–Sen + Mann–Kendall (timed apart, slowest thread): about ${slowest(extras.map((r) => r.robustTrendMs)).toFixed(0)} ms`);
  console.log(`plain summing loop over the same arrays: ${sumMs.toFixed(1)} ms; wall time / sum = ${(wallMs / sumMs).toFixed(0)}×`);
  console.log(`peak memory: maxRSS ${rssMb.toFixed(0)} MB (whole process); heap used now ${(process.memoryUsage().heapUsed / 2 ** 20).toFixed(0)} MB (main thread)`);
  const signals = engines.reduce((total, r) => total + r.signals, 0);
  const trendSum = engines.reduce((total, r) => total + r.trendSum, 0);
  console.log(`signals found: ${signals}; trend sum ${trendSum.toFixed(9)}; checksum ${extras.reduce((total, r) => total + r.checksum, 0).toFixed(4)}`);
  if (seriesCount === 2000 && points === 1100) console.log(`target (whole fleet < 1000 ms): ${wallMs < 1000 ? "met" : "not met"}`);
}

if (isMainThread) {
  await main();
} else {
  // Build the share before the clock starts, then wait for the signal so that all threads start together.
  const port = parentPort;
  const fleet = buildShare(workerData as Job);
  warmUp(workerData as Job);
  port?.postMessage("ready");
  port?.on("message", (message: string) => port.postMessage(message === "engine" ? analyzeShare(fleet) : extraTimings(fleet)));
}
