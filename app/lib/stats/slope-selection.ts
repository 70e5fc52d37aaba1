import { inversionCounter, type InversionCounter } from "./inversions";
import { selectKth } from "./select";

const SAMPLE_SIZE = 1024;
const MAX_ROUNDS = 60;

// Listing buffers run to hundreds of kilobytes per series: reusing one spares the garbage collector.
// It is plain scratch space, never read before it is written, so results never depend on it.
let scratchBuffer = new Float64Array(0);

function scratch(size: number): Float64Array {
  if (scratchBuffer.length < size) scratchBuffer = new Float64Array(Math.max(size, 2 * scratchBuffer.length));
  return scratchBuffer.subarray(0, size);
}

/**
 * Rank selection among pairwise slopes without listing them all: for x-sorted points, slope(i, j) < θ exactly
 * when yⱼ − θxⱼ < yᵢ − θxᵢ, so counting inversions of y − θx counts the slopes below θ. A sample of slopes
 * picks a bracket, interpolation narrows it if needed, then the pairs inside are listed by re-sorting the order
 * at the lower end with the keys of the upper end (each swap is one pair). The sample only guides the search.
 */
export class SlopeSelector {
  private readonly n: number;
  private readonly counter: InversionCounter;
  private readonly keys: Float64Array;
  private readonly order: Int32Array;
  private readonly lowOrder: Int32Array;
  private readonly sample: Float64Array;
  private readonly range: [number, number];
  private lo = 0;
  private hi = 0;
  private countLo = 0;
  private countHi = 0;
  private lowOrderValid = false;
  private wideSample: Float64Array | null = null;

  constructor(private readonly xs: Float64Array, private readonly ys: Float64Array, private readonly pairs: number) {
    this.n = xs.length;
    this.counter = inversionCounter(this.n);
    this.keys = new Float64Array(this.n);
    this.order = new Int32Array(this.n);
    this.lowOrder = new Int32Array(this.n);
    this.range = this.slopeRange();
    this.sample = sampleSlopes(xs, ys, SAMPLE_SIZE);
  }

  /** Median slope of x-sorted points with `pairs` distinct-x pairs: ranks ⌊(N − 1)/2⌋ and ⌊N/2⌋ (0-based), averaged when they differ. */
  median(): number {
    // Pair counts pass 2³¹ from about 65 000 points, so no bit shifts here.
    const first = Math.floor((this.pairs - 1) / 2);
    const second = Math.floor(this.pairs / 2);
    const [a, b] = this.selectRanks(first, second);
    if (first === second) return a;
    return (a + (Number.isNaN(b) ? this.selectRanks(second, second)[0] : b)) / 2;
  }

  /** Slopes of rank `first` and `second` (adjacent or equal); the second is NaN when the bracket split them. */
  private selectRanks(first: number, second: number): [number, number] {
    [this.lo, this.hi] = this.range;
    [this.countLo, this.countHi] = [0, this.pairs];
    this.lowOrderValid = false;
    const { lowerGuess, upperGuess, tieWidth } = bracketGuess(this.sample, (first + 0.5) / this.pairs);
    // Pairs listed at once: enough to skip narrowing for a thousand points, bounded (64n) for a hundred thousand.
    const limit = Math.max(4 * this.n, Math.min(this.pairs / 8, 64 * this.n));
    const [tied, tiedCount] = mostFrequentBetween(this.sample, lowerGuess, upperGuess);
    if ((tiedCount / this.sample.length) * this.pairs > limit / 4) {
      // Readings on a coarse grid give blocks of identical slopes (0 above all): carve the block out of the
      // bracket, or answer with it when the median lies inside it.
      this.probe(tied, first);
      this.probe(tied + tieWidth, first);
      if (this.lo === tied && this.hi === tied + tieWidth && second < this.countHi) return [tied, tied];
    }
    // A four times larger sample halves the bracket, and so the pairs to list, for the cost of drawing it.
    this.wideSample ??= sampleSlopes(this.xs, this.ys, 4 * SAMPLE_SIZE);
    const wide = bracketGuess(this.wideSample, (first + 0.5) / this.pairs);
    // Just above a sample slope, so that a block of slopes equal to it stays below the bracket.
    this.probe(wide.lowerGuess + tieWidth, first);
    const listTo = Math.min(wide.upperGuess, this.hi);
    if (this.countLo <= first && listTo > this.lo) {
      const listed = this.listBelow(listTo, limit);
      if (listed && this.countLo + listed.length > second) return this.pick(listed, first, second);
      if (listed) [this.lo, this.countLo] = [listTo, this.countLo + listed.length];
      else this.lowOrderValid = false;
    }
    for (let round = 0; round < MAX_ROUNDS && this.countHi - this.countLo > limit; round++) {
      if (this.hi - this.lo <= tieWidth) {
        // A block of (nearly) equal slopes wider than the limit: any one of them is the answer to 1e−6 of the spread.
        const tied = this.listBelow(this.hi, 1, true)?.[0] ?? this.lo;
        return [tied, second < this.countHi ? tied : Number.NaN];
      }
      const before = this.countHi - this.countLo;
      const margin = Math.max(limit / 4, before / 16);
      this.probe(this.interpolate(first + 0.5 - margin), first);
      this.probe(this.interpolate(second + 0.5 + margin), first);
      if (this.countHi - this.countLo > before / 2) this.probe((this.lo + this.hi) / 2, first);
    }
    return this.pick(this.listBelow(this.hi, Infinity) ?? new Float64Array(0), first, second);
  }

  /** Slopes below θ, with the sorted order of y − θx left in `order`. */
  private countBelow(theta: number): number {
    for (let i = 0; i < this.n; i++) this.keys[i] = this.ys[i] - theta * this.xs[i];
    return this.counter.sortCountingInversions(this.keys, this.n, this.order);
  }

  private probe(theta: number, rank: number): void {
    if (!(theta > this.lo && theta < this.hi)) return;
    const below = this.countBelow(theta);
    if (below <= rank) {
      [this.lo, this.countLo] = [theta, below];
      this.lowOrder.set(this.order);
      this.lowOrderValid = true;
    } else [this.hi, this.countHi] = [theta, below];
  }

  private interpolate(rank: number): number {
    const fraction = (rank - this.countLo) / (this.countHi - this.countLo);
    return this.lo + Math.min(1, Math.max(0, fraction)) * (this.hi - this.lo);
  }

  /**
   * Slopes in [lo, θ): re-sorts the order at lo by the keys at θ, one swap per pair; the order is then the
   * order at θ. Beyond `limit` pairs the order is spoilt: null, or the first `limit` slopes when `partial`.
   */
  private listBelow(theta: number, limit: number, partial = false): Float64Array | null {
    const { xs, ys, n } = this;
    if (!this.lowOrderValid) {
      this.countBelow(this.lo);
      this.lowOrder.set(this.order);
    }
    const order = this.lowOrder;
    const keys = this.keys;
    for (let i = 0; i < n; i++) keys[i] = ys[i] - theta * xs[i];
    const found = scratch(Math.min(limit, this.countHi - this.countLo) + n);
    let count = 0;
    for (let position = 1; position < n; position++) {
      const current = order[position];
      const key = keys[current];
      let p = position - 1;
      for (; p >= 0 && keys[order[p]] > key; p--) {
        const other = order[p];
        if (count === found.length) {
          this.lowOrderValid = false;
          return partial ? found : null;
        }
        found[count++] = (ys[current] - ys[other]) / (xs[current] - xs[other]);
        order[p + 1] = other;
      }
      order[p + 1] = current;
    }
    this.lowOrderValid = true;
    return found.subarray(0, count);
  }

  private pick(listed: Float64Array, first: number, second: number): [number, number] {
    const k = first - this.countLo;
    if (listed.length === 0) return [this.lo, this.lo];
    const a = selectKth(listed, Math.min(listed.length - 1, Math.max(0, k)));
    if (second === first) return [a, a];
    if (k + 1 >= listed.length) return [a, Number.NaN];
    let b = Infinity;
    for (let i = k + 1; i < listed.length; i++) if (listed[i] < b) b = listed[i];
    return [a, b];
  }

  /** Bounds just outside the smallest and largest pairwise slope, which lie between neighbouring x-groups. */
  private slopeRange(): [number, number] {
    let low = Infinity;
    let high = -Infinity;
    for (let start = 0, end = 0, previous = -1; start < this.n; previous = start, start = end) {
      while (end < this.n && this.xs[end] === this.xs[start]) end++;
      if (previous < 0) continue;
      const dx = this.xs[start] - this.xs[previous];
      high = Math.max(high, (this.ys[end - 1] - this.ys[previous]) / dx);
      low = Math.min(low, (this.ys[start] - this.ys[start - 1]) / dx);
    }
    const pad = (high - low) * 1e-6 + (Math.abs(high) + Math.abs(low)) * 1e-12 + Number.MIN_VALUE;
    return [low - pad, high + pad];
  }
}

/** Sample slopes around the sample quantile q (± 2 standard errors of a quantile) and a width below which slopes count as equal. */
function bracketGuess(sample: Float64Array, q: number): { lowerGuess: number; upperGuess: number; tieWidth: number } {
  const m = sample.length;
  const at = q * m;
  const spread = 2 * Math.sqrt(at * (1 - q)) + 1;
  const lowerGuess = selectKth(sample, Math.max(0, Math.floor(at - spread)));
  const upperGuess = selectKth(sample, Math.min(m - 1, Math.ceil(at + spread)));
  const scale = upperGuess > lowerGuess ? upperGuess - lowerGuess : selectKth(sample, m - 1) - selectKth(sample, 0);
  const tieWidth = 1e-6 * scale + 1e-9 * Math.max(Math.abs(lowerGuess), Math.abs(upperGuess)) + Number.MIN_VALUE;
  return { lowerGuess, upperGuess, tieWidth };
}

/** The most frequent value among those in [low, high] and how often it occurs; [NaN, 0] when none lies there. */
function mostFrequentBetween(values: Float64Array, low: number, high: number): [number, number] {
  const inside = values.filter((v) => v >= low && v <= high).sort();
  let best = Number.NaN;
  let bestCount = 0;
  for (let start = 0, end = 0; start < inside.length; start = end) {
    while (end < inside.length && inside[end] === inside[start]) end++;
    if (end - start > bestCount) [best, bestCount] = [inside[start], end - start];
  }
  return [best, bestCount];
}

/** Slopes of `size` pseudo-random pairs with distinct x (xorshift32, fixed seed: the result never depends on it). */
function sampleSlopes(xs: Float64Array, ys: Float64Array, size: number): Float64Array {
  const n = xs.length;
  const sample = new Float64Array(size);
  let state = (0x9e3779b9 ^ n) | 0;
  let count = 0;
  for (let tries = 0; count < size && tries < 20 * size; tries++) {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const a = (state >>> 1) % n;
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const b = (state >>> 1) % n;
    if (xs[a] !== xs[b]) sample[count++] = (ys[b] - ys[a]) / (xs[b] - xs[a]);
  }
  return sample.subarray(0, Math.max(1, count));
}
