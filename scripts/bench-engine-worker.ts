// The working side of scripts/bench-engine.ts: the seeded fleet, and a loop that claims series a few at a time
// from a counter shared by all threads, so that a thread slowed by other work on the machine simply takes fewer.
// The fleet is built once, in memory all threads share; each claimed series is copied into a plain array first,
// as callers hand the engine arrays of numbers. It runs in the main thread for --threads 1 and as the worker entry otherwise.
import { isMainThread, parentPort, workerData } from "node:worker_threads";
import { analyzeSeries } from "../app/lib/stats/analyze";
import { theilSenAndMannKendall } from "../app/lib/stats/theil-sen";
import { daysSinceFirstMs } from "../app/lib/stats/time-axis";
import { seededRandom } from "../db/seed/random";

export interface Job {
  seriesCount: number;
  points: number;
  iso: boolean;
  warmup: number;
  /** Int32 claim counter, then per series a Float64 digest of the trend and an Int32 count of signals. */
  shared: SharedArrayBuffer;
  /** The fleet's values, series after series (`seriesCount` × `points` Float64). */
  values: SharedArrayBuffer;
}

export interface EngineResult {
  engineMs: number;
  /** Process CPU time during the loop (all threads, the collector's helpers too): other load moves it less than wall time. */
  engineCpuMs: number;
  analysed: number;
}

export interface ExtraResult {
  robustTrendMs: number;
  sumMs: number;
}

const DAY_MS = 86_400_000;
const START = Date.UTC(2024, 0, 8, 7, 30);
const READABILITY = 0.0001;
/** Series claimed at a time: small enough to balance the threads, large enough that claiming costs nothing. */
const CHUNK = 8;
const TOLERANCE = { upper: 100.1, lower: 99.9, guardBand: 0.1 / 3 };

/** Check times shared by the fleet (daily, at a random minute of the morning), as epoch ms and as ISO strings. */
function buildTimes(points: number): { ms: Float64Array; iso: string[] } {
  const random = seededRandom(0x51ed);
  const ms = Float64Array.from({ length: points }, (_, i) => START + i * DAY_MS + Math.floor(random() * 3_600_000));
  return { ms, iso: Array.from(ms, (t) => new Date(t).toISOString()) };
}

/** Series i: a 100 g sensitivity check read to 0.1 mg, daily, some drifting, some with a step after a repair. */
function buildValues(index: number, points: number): number[] {
  const random = seededRandom(0x7a4e11 + index);
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

/** A job with its shared buffers: the counter (padded to 8 bytes), digests and signal counts; and the fleet, built here. */
export function createJob(seriesCount: number, points: number, iso: boolean, warmup: number): Job {
  const values = new SharedArrayBuffer(seriesCount * points * 8);
  for (let i = 0; i < seriesCount; i++) new Float64Array(values, i * points * 8, points).set(buildValues(i, points));
  return { seriesCount, points, iso, warmup, shared: new SharedArrayBuffer(8 + seriesCount * 12), values };
}

/** A thread's view of the fleet: each thread analyses the series it claims. */
export class FleetWorker {
  private readonly times: { ms: Float64Array; iso: string[] };
  private readonly fleet: Float64Array;
  private readonly series: number[];
  private readonly counter: Int32Array;
  private readonly digests: Float64Array;
  private readonly signals: Int32Array;
  private readonly claimed: number[] = [];

  constructor(private readonly job: Job) {
    this.times = buildTimes(job.points);
    this.fleet = new Float64Array(job.values);
    this.series = new Array<number>(job.points).fill(0);
    this.counter = new Int32Array(job.shared, 0, 1);
    this.digests = new Float64Array(job.shared, 8, job.seriesCount);
    this.signals = new Int32Array(job.shared, 8 + 8 * job.seriesCount, job.seriesCount);
  }

  /** Series from seeds the fleet never uses, analysed before the clock starts when --warmup is given. */
  warmUp(): void {
    for (let k = 0; k < this.job.warmup; k++) this.analyze(buildValues(1_000_000 + k, this.job.points));
  }

  /** Claims and analyses series until none are left. */
  run(): EngineResult {
    const started = performance.now();
    const cpuBefore = process.cpuUsage();
    for (let first = Atomics.add(this.counter, 0, CHUNK); first < this.job.seriesCount; first = Atomics.add(this.counter, 0, CHUNK)) {
      for (let i = first; i < Math.min(first + CHUNK, this.job.seriesCount); i++) {
        const result = this.analyze(this.copy(i));
        this.signals[i] = result.signals.length;
        this.digests[i] = result.trend ? result.trend.slope + result.trend.pValue + result.trend.theilSen * 1e6 + result.trend.mannKendallP : 0;
        this.claimed.push(i);
      }
    }
    const cpu = process.cpuUsage(cpuBefore);
    return { engineMs: performance.now() - started, engineCpuMs: (cpu.user + cpu.system) / 1000, analysed: this.claimed.length };
  }

  /** Over the series this thread analysed: Theil–Sen with Mann–Kendall alone, and a plain loop summing the values. */
  extras(): ExtraResult {
    const axis = daysSinceFirstMs(this.times.ms);
    const robustStarted = performance.now();
    let slopes = 0;
    for (const i of this.claimed) slopes += theilSenAndMannKendall(axis, this.copy(i)).theilSen;
    const robustTrendMs = performance.now() - robustStarted;
    const sumStarted = performance.now();
    let sum = 0;
    const { fleet, job } = this;
    for (const i of this.claimed) for (let k = i * job.points; k < (i + 1) * job.points; k++) sum += fleet[k];
    const sumMs = performance.now() - sumStarted;
    if (!Number.isFinite(sum + slopes)) throw new Error("unreachable: keeps the loops from being optimised away");
    return { robustTrendMs, sumMs };
  }

  /** Series i in the reused plain array (the engine keeps no reference to its input). */
  private copy(i: number): number[] {
    const { points } = this.job;
    for (let k = 0, at = i * points; k < points; k++) this.series[k] = this.fleet[at + k];
    return this.series;
  }

  private analyze(values: number[]) {
    const times = this.job.iso ? { times: this.times.iso } : { timesMs: this.times.ms };
    return analyzeSeries({ values, ...times, resolution: READABILITY, tolerance: TOLERANCE });
  }
}

if (!isMainThread && parentPort) {
  // Build before the clock starts, then wait for the signal so that all threads start together.
  const port = parentPort;
  const worker = new FleetWorker(workerData as Job);
  worker.warmUp();
  port.postMessage("ready");
  port.on("message", (message: string) => port.postMessage(message === "engine" ? worker.run() : worker.extras()));
}
