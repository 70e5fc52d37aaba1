// Timing helpers for the dashboard benchmark: latency percentiles, streamed line counts, and a server's memory.
import { readFileSync } from "node:fs";

export interface Latency {
  p50: number;
  p95: number;
  runs: number;
}

/** Nearest-rank percentile of ascending samples. */
function percentile(sorted: number[], p: number): number {
  return sorted[Math.max(0, Math.ceil(p * sorted.length) - 1)];
}

/** Runs `fn` a few times unmeasured (JIT, caches, pooled connections), then `runs` times one after another. */
export async function sample(runs: number, warmup: number, fn: () => Promise<unknown>): Promise<Latency> {
  for (let i = 0; i < warmup; i++) await fn();
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    samples.push(performance.now() - t);
  }
  samples.sort((a, b) => a - b);
  return { p50: percentile(samples, 0.5), p95: percentile(samples, 0.95), runs };
}

export const median = (values: number[]) => percentile([...values].sort((a, b) => a - b), 0.5);
export const ms = (v: number) => `${v.toFixed(1)} ms`;
export const mib = (bytes: number) => `${(bytes / 2 ** 20).toFixed(0)} MB`;
export const whole = (v: number) => Math.round(v).toLocaleString("en");
export const verdict = (met: boolean) => (met ? "met" : "NOT met");

/** A GET with the bench token; the body is read in full so the time includes the transfer, not the parse. */
export async function get(url: string, token: string, headers: Record<string, string> = {}): Promise<Response> {
  const response = await fetch(url, { headers: { authorization: `Bearer ${token}`, ...headers } });
  if (!response.ok) throw new Error(`GET ${url} answered ${response.status}: ${(await response.text()).slice(0, 300)}`);
  return response;
}

/** Newline bytes in a byte stream: one per CSV record, since neither the bench data nor COPY puts one inside a cell. */
export async function countLines(chunks: AsyncIterable<Uint8Array>): Promise<{ lines: number; bytes: number }> {
  let lines = 0;
  let bytes = 0;
  for await (const chunk of chunks) {
    bytes += chunk.length;
    for (let at = chunk.indexOf(10); at !== -1; at = chunk.indexOf(10, at + 1)) lines++;
  }
  return { lines, bytes };
}

/** VmRSS and VmHWM (its peak over the process's life) from /proc, in bytes. */
function memoryOf(pid: number): { rss: number; hwm: number } {
  const status = readFileSync(`/proc/${pid}/status`, "utf8");
  const kb = (field: string) => Number(new RegExp(`^${field}:\\s+(\\d+) kB`, "m").exec(status)?.[1] ?? 0) * 1024;
  return { rss: kb("VmRSS"), hwm: kb("VmHWM") };
}

/**
 * Samples a process's resident memory every 50 ms while `work` runs. VmHWM alone would also hold peaks from
 * earlier requests, so the sampled peak is compared with the RSS just before.
 */
export async function withMemorySampling<T>(pid: number, work: () => Promise<T>) {
  const before = memoryOf(pid);
  let peak = before.rss;
  const timer = setInterval(() => {
    peak = Math.max(peak, memoryOf(pid).rss);
  }, 50);
  try {
    const result = await work();
    const after = memoryOf(pid);
    return { result, before: before.rss, peak: Math.max(peak, after.rss), hwmBefore: before.hwm, hwmAfter: after.hwm };
  } finally {
    clearInterval(timer);
  }
}

/** COPY takes no parameters: the query's $n placeholders become literals, arrays as '{…}'. */
export function inlineValues(query: { text: string; values: unknown[] }, escapeLiteral: (s: string) => string): string {
  return query.text.replace(/\$(\d+)/g, (_, n: string) => {
    const value = query.values[Number(n) - 1];
    return Array.isArray(value) ? escapeLiteral(`{${value.join(",")}}`) : escapeLiteral(String(value));
  });
}
