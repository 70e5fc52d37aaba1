// Engine benchmark: full series analysis (run rules, EWMA, CUSUM, trend, forecast) of a fleet of seeded
// synthetic series, in one process. Usage: npx tsx scripts/bench-engine.ts [--series 2000] [--points 1100] [--threads 2]
import { availableParallelism } from "node:os";
import { isMainThread, parentPort, Worker, workerData } from "node:worker_threads";
import { analyzeSeries } from "../app/lib/stats/analyze";
import { mannKendall } from "../app/lib/stats/mann-kendall";
import { theilSenSlope } from "../app/lib/stats/theil-sen";
import { daysSinceFirst } from "../app/lib/stats/time-axis";

interface Job {
  first: number;
  count: number;
  points: number;
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
function buildTimes(points: number): string[] {
  const random = generator(0x51ed);
  return Array.from({ length: points }, (_, i) => new Date(START + i * DAY_MS + Math.floor(random() * 3_600_000)).toISOString());
}

/** Series i: a 100 g sensitivity check read to 0.1 mg, daily, some drifting, some with a step after a repair. */
function buildSeries(index: number, points: number, times: string[]): { values: number[]; times: string[] } {
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
  return { values, times };
}

type Fleet = ReturnType<typeof buildSeries>[];

function buildShare(job: Job): Fleet {
  const times = buildTimes(job.points);
  return Array.from({ length: job.count }, (_, k) => buildSeries(job.first + k, job.points, times));
}

interface ShareResult {
  engineMs: number;
  /** Process CPU time during the engine loop: with one thread, a figure that other load on the machine barely moves. */
  engineCpuMs: number;
  robustTrendMs: number;
  sumMs: number;
  signals: number;
  checksum: number;
}

function analyzeShare(fleet: Fleet): ShareResult {
  const tolerance = { upper: 100.1, lower: 99.9, guardBand: 0.1 / 3 };
  const started = performance.now();
  const cpuBefore = process.cpuUsage();
  let signals = 0;
  for (const series of fleet) {
    signals += analyzeSeries({ values: series.values, times: series.times, resolution: READABILITY, tolerance }).signals.length;
  }
  const engineMs = performance.now() - started;
  const cpu = process.cpuUsage(cpuBefore);
  const engineCpuMs = (cpu.user + cpu.system) / 1000;
  // The share of the two O(n log n) robust statistics, timed again on their own.
  const robustStarted = performance.now();
  let slopeSum = 0;
  for (const series of fleet) {
    slopeSum += theilSenSlope(daysSinceFirst(series.times), series.values);
    slopeSum += mannKendall(series.values).pValue;
  }
  const robustTrendMs = performance.now() - robustStarted;
  const sumStarted = performance.now();
  let checksum = 0;
  for (const series of fleet) for (let i = 0; i < series.values.length; i++) checksum += series.values[i];
  return { engineMs, engineCpuMs, robustTrendMs, sumMs: performance.now() - sumStarted, signals, checksum: checksum + 0 * slopeSum };
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

async function main(): Promise<void> {
  const seriesCount = option("series", 2000);
  const points = option("points", 1100);
  const threads = Math.max(1, Math.min(option("threads", 2), availableParallelism()));
  const share = Math.ceil(seriesCount / threads);
  const jobs: Job[] = Array.from({ length: threads }, (_, t) => ({ first: t * share, count: Math.max(0, Math.min(share, seriesCount - t * share)), points }));
  if (threads === 1) return report([analyzeShare(buildShare(jobs[0]))], seriesCount, points, threads, null);
  const ready: Promise<void>[] = [];
  const workers = jobs.map((job) => {
    const worker = new Worker(workerEntry(), { workerData: job });
    ready.push(new Promise((resolve) => worker.once("message", () => resolve())));
    return worker;
  });
  await Promise.all(ready);
  const started = performance.now();
  const results = await Promise.all(
    workers.map((worker) => new Promise<ShareResult>((resolve) => {
      worker.once("message", resolve);
      worker.postMessage("go");
    })),
  );
  const wallMs = performance.now() - started;
  await Promise.all(workers.map((worker) => worker.terminate()));
  report(results, seriesCount, points, threads, wallMs);
}

function report(results: ShareResult[], seriesCount: number, points: number, threads: number, wallMs: number | null): void {
  const totalPoints = seriesCount * points;
  const engineMs = Math.max(...results.map((r) => r.engineMs));
  const sumMs = Math.max(...results.map((r) => r.sumMs));
  const robustTrendMs = Math.max(...results.map((r) => r.robustTrendMs));
  const rssMb = process.resourceUsage().maxRSS / 1024;
  console.log(`series ${seriesCount} × points ${points} = ${totalPoints.toLocaleString("en-GB")} points on ${threads} thread(s)`);
  if (wallMs !== null) console.log(`wall time, start signal to last result (includes the extra timings below): ${wallMs.toFixed(0)} ms`);
  console.log(`engine time (slowest thread): ${engineMs.toFixed(0)} ms, ${(totalPoints / (engineMs / 1000) / 1e6).toFixed(2)} M points/s`);
  if (threads === 1) console.log(`  CPU time of that loop: ${results[0].engineCpuMs.toFixed(0)} ms (wall time stretches when other work shares the cores)`);
  console.log(`  of which Theil–Sen + Mann–Kendall alone (timed apart, slowest thread): about ${robustTrendMs.toFixed(0)} ms`);
  console.log(`plain summing loop over the same arrays: ${sumMs.toFixed(1)} ms; engine / sum = ${(engineMs / sumMs).toFixed(0)}×`);
  console.log(`peak memory: maxRSS ${rssMb.toFixed(0)} MB; heap used now ${(process.memoryUsage().heapUsed / 2 ** 20).toFixed(0)} MB (main thread)`);
  console.log(`signals found: ${results.reduce((total, r) => total + r.signals, 0)}; checksum ${results.reduce((total, r) => total + r.checksum, 0).toFixed(4)}`);
  if (seriesCount === 2000 && points === 1100) console.log(`target (whole fleet < 1000 ms): ${engineMs < 1000 ? "met" : "not met"}`);
}

if (isMainThread) {
  await main();
} else {
  // Build the share before the clock starts, then wait for the signal so that all threads start together.
  const port = parentPort;
  const fleet = buildShare(workerData as Job);
  port?.postMessage("ready");
  port?.once("message", () => port.postMessage(analyzeShare(fleet)));
}
