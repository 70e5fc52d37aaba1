// Engine benchmark: full series analysis (run rules, EWMA, CUSUM, trend, forecast) of a fleet of seeded synthetic
// series, in one process. Usage: npx tsx scripts/bench-engine.ts [--series 2000] [--points 1100] [--threads 2] [--iso] [--warmup 0]
// Times go in as epoch milliseconds (the bulk path); --iso passes ISO strings instead, as the API does.
// The clock starts cold, as a one-off fleet job would; --warmup N first analyses N other series on each thread
// (not timed), which shows the steady state of a long-running process once the compiler has done its work.
import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";
import { createJob, FleetWorker, type EngineResult, type ExtraResult, type Job } from "./bench-engine-worker";

function option(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}

/** Workers do not inherit tsx's loader: a tiny ES module registers it, then loads the worker file. */
function workerEntry(): URL {
  const register = JSON.stringify(import.meta.resolve("tsx/esm/api"));
  const worker = JSON.stringify(new URL("./bench-engine-worker.ts", import.meta.url).href);
  const code = `import { register } from ${register}; register(); await import(${worker});`;
  return new URL(`data:text/javascript,${encodeURIComponent(code)}`);
}

function ask<T>(worker: Worker, message: string): Promise<T> {
  return new Promise((resolve) => {
    worker.once("message", resolve);
    worker.postMessage(message);
  });
}

interface Run {
  job: Job;
  threads: number;
  /** Start signal to the last engine result: the figure the target is about. */
  wallMs: number;
  engines: EngineResult[];
  extras: ExtraResult[];
}

async function main(): Promise<void> {
  const seriesCount = option("series", 2000);
  const job = createJob(seriesCount, option("points", 1100), process.argv.includes("--iso"), option("warmup", 0));
  const threads = Math.max(1, Math.min(option("threads", 2), availableParallelism()));
  if (threads === 1) {
    const worker = new FleetWorker(job);
    worker.warmUp();
    const started = performance.now();
    const engine = worker.run();
    const wallMs = performance.now() - started;
    return report({ job, threads, wallMs, engines: [engine], extras: [worker.extras()] });
  }
  const ready: Promise<void>[] = [];
  const workers = Array.from({ length: threads }, () => {
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
  report({ job, threads, wallMs, engines, extras });
}

function report({ job, threads, wallMs, engines, extras }: Run): void {
  const { seriesCount, points } = job;
  const totalPoints = seriesCount * points;
  const sumMs = extras.reduce((total, r) => total + r.sumMs, 0);
  const rssMb = process.resourceUsage().maxRSS / 1024;
  const start = job.warmup > 0 ? `warm (after ${job.warmup} other series per thread)` : "cold";
  console.log(`series ${seriesCount} × points ${points} = ${totalPoints.toLocaleString("en-GB")} points on ${threads} thread(s), times as ${job.iso ? "ISO strings" : "epoch ms"}, ${start}`);
  console.log(`wall time, start signal to last engine result: ${wallMs.toFixed(0)} ms, ${(totalPoints / (wallMs / 1000) / 1e6).toFixed(2)} M points/s`);
  console.log(`series per thread: ${engines.map((r) => `${r.analysed} in ${r.engineMs.toFixed(0)} ms`).join(", ")}`);
  if (threads === 1) console.log(`  CPU time of that loop: ${engines[0].engineCpuMs.toFixed(0)} ms (wall time stretches when other work shares the cores)`);
  console.log(`  of which Theil–Sen + Mann–Kendall (timed apart, summed over threads): about ${extras.reduce((total, r) => total + r.robustTrendMs, 0).toFixed(0)} ms`);
  console.log(`plain summing loop over the same arrays (summed over threads): ${sumMs.toFixed(1)} ms; wall time / sum = ${(wallMs / sumMs).toFixed(0)}×`);
  console.log(`peak memory: maxRSS ${rssMb.toFixed(0)} MB (whole process); heap used now ${(process.memoryUsage().heapUsed / 2 ** 20).toFixed(0)} MB (main thread)`);
  // Per-series results summed in series order, so that they do not depend on which thread took which series.
  const digests = new Float64Array(job.shared, 8, seriesCount);
  const signals = new Int32Array(job.shared, 8 + 8 * seriesCount, seriesCount);
  console.log(`signals found: ${signals.reduce((total, s) => total + s, 0)}; trend digest ${digests.reduce((total, d) => total + d, 0).toFixed(9)}`);
  if (seriesCount === 2000 && points === 1100) console.log(`target (whole fleet < 1000 ms): ${wallMs < 1000 ? "met" : "not met"}`);
}

await main();
