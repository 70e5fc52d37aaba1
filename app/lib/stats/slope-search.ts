import { Scratch } from "./scratch";
import { selectKth, selectPairByBuckets } from "./select";
import type { Listing, SlopeKeys } from "./slope-keys";

const SAMPLE_SIZE = 4096;
/** A merge sort of the keys costs about as much as listing this many pairs. */
const SORT_COST_PAIRS = 4000;
/** Sample standard errors on each side of the wanted ranks in the fallback bracket; widened fourfold when it missed. */
const SPREAD = 3;

const scratch = new Scratch();
const sampleBuffer = new Float64Array(SAMPLE_SIZE);

/** The slopes above 0 of x-sorted points: `nonPositive` of the `pairs` slopes are ≤ 0; `zeroPlus` gives the order just above slope 0. */
export interface PositiveSide {
  keys: SlopeKeys;
  pairs: number;
  nonPositive: number;
  zeroPlus: () => Int32Array;
}

/** Knobs for tests, so that they reach every path: skip the estimate (straight to the brackets), or narrow from fewer listed pairs. */
export interface SearchTuning {
  estimate: boolean;
  maxList: number | null;
}

export const DEFAULT_TUNING: SearchTuning = { estimate: true, maxList: null };

/** Slopes of ranks first ≤ second ≤ first + 1 (0-based among all pairs, both ≥ nonPositive), exactly as the computed slopes rank. */
export function selectPositive(side: PositiveSide, first: number, second: number, tuning = DEFAULT_TUNING): [number, number] {
  const sample = positiveSample(side.keys);
  const most = tuning.maxList ?? Math.max(1 << 16, 32 * side.keys.n);
  const found = tuning.estimate ? fromEstimate(side, sample, first, second, most) : null;
  if (found) return found;
  // The estimate missed (rarely): brackets from the sample, widened fourfold until one holds both ranks.
  const positives = side.pairs - side.nonPositive;
  const p = sample.length;
  for (let spread = SPREAD; ; spread *= 4) {
    const q1 = (first - side.nonPositive + 0.5) / positives;
    const q2 = (second - side.nonPositive + 0.5) / positives;
    const lowAt = Math.floor(q1 * p - spread * Math.sqrt(p * q1 * (1 - q1)) - 1);
    const highAt = Math.ceil(q2 * p + spread * Math.sqrt(p * q2 * (1 - q2)) + 1);
    const low = lowAt < 0 || p === 0 ? 0 : selectKth(sample, lowAt);
    const high = highAt >= p ? Infinity : selectKth(sample, highAt);
    let inside = 0;
    for (let i = 0; i < p; i++) if (sample[i] >= low && sample[i] <= high) inside++;
    const expected = ((inside + 1) / Math.max(p, 1)) * positives;
    const whole = low === 0 && high === Infinity;
    const bracketed = within(side, low, high, first, second, whole ? Infinity : Math.ceil(2 * expected + 16 * Math.sqrt(expected) + 1024), expected, most);
    if (bracketed) return bracketed;
    if (whole) throw new Error("Slope selection over all pairs failed: this is a bug");
  }
}

/**
 * One exact count at the sample's estimate θ₀ of the wanted slope tells how many ranks lie between θ₀ and it, and on
 * which side; the sample then says how far to list on that side: a few times fewer pairs than a two-sided bracket.
 * Just above the zero block the count is skipped, since the order at 0⁺ is known. Null when the listing missed.
 */
function fromEstimate(side: PositiveSide, sample: Float64Array, first: number, second: number, most: number): [number, number] | null {
  const { keys, nonPositive } = side;
  const p = sample.length;
  if (p < 64) return null;
  const perSample = (side.pairs - nonPositive) / p;
  const q = (first - nonPositive + 0.5) / (side.pairs - nonPositive);
  const estimateAt = Math.min(p - 1, Math.floor(q * p));
  const reach = (ranks: number) => {
    const expected = ranks / perSample;
    return Math.ceil(expected + 3 * Math.sqrt(expected + 1) + 1);
  };
  const limit = (samples: number) => Math.min(most, Math.ceil(4 * samples * perSample + 4096));
  const order = scratch.int32(0, keys.n);
  const sampleAt = (at: number) => (at < p ? selectKth(sample, at) : Infinity);
  if (estimateAt * perSample < SORT_COST_PAIRS) {
    const upperAt = reach(second + 1 - nonPositive);
    const upper = sampleAt(upperAt);
    order.set(side.zeroPlus());
    return pick(keys.list(order, upper, 0, upper - keys.margin(upper), limit(upperAt)), nonPositive, first, second, limit(upperAt));
  }
  const estimate = selectKth(sample, estimateAt);
  const counted = keys.countBelow(estimate, order);
  if (counted <= first) {
    const upperAt = estimateAt + reach(second + 1 - counted);
    const upper = sampleAt(upperAt);
    const listing = keys.list(order, upper, estimate + keys.margin(estimate), upper - keys.margin(upper), limit(upperAt - estimateAt));
    return pick(listing, counted, first, second, limit(upperAt - estimateAt));
  }
  if (counted <= second) return null;
  const lowerAt = estimateAt - reach(counted - first);
  const upperBound = estimate - keys.margin(estimate);
  if (lowerAt < 0) {
    order.set(side.zeroPlus());
    return pick(keys.list(order, estimate, 0, upperBound, limit(estimateAt)), nonPositive, first, second, limit(estimateAt));
  }
  // Downward: re-sorting by the keys at the lower slope undoes the inversions of the pairs in between.
  const lower = selectKth(sample, lowerAt);
  const listing = keys.list(order, lower, lower + keys.margin(lower), upperBound, limit(estimateAt - lowerAt));
  return pick(listing, counted - listing.swaps, first, second, limit(estimateAt - lowerAt));
}

/** Ranks first and second among slopes in [low, high] (low 0 stands for "just above 0"), or null when the bracket missed them. */
function within(side: PositiveSide, low: number, high: number, first: number, second: number, limit: number, expected: number, most: number): [number, number] | null {
  const { keys } = side;
  const order = scratch.int32(0, keys.n);
  let count = side.nonPositive;
  if (low === 0) order.set(side.zeroPlus());
  else count = keys.countBelow(low - keys.margin(low), order);
  if (count > first) return null;
  if (expected > most) {
    [low, high, count] = narrow(keys, order, low, high, count, first, second, most);
    limit = Infinity;
  }
  return pick(keys.list(order, high === Infinity ? high : high + keys.margin(high), low, high, limit), count, first, second, limit);
}

/** For long series: probes at interpolated slopes until the bracket holds about `most` pairs (or cannot be split); `order` follows the lower end. */
function narrow(keys: SlopeKeys, order: Int32Array, low: number, high: number, count: number, first: number, second: number, most: number): [number, number, number] {
  const probeOrder = scratch.int32(1, keys.n);
  if (high === Infinity) high = keys.maxSlope();
  let highCount = keys.countBelow(high + keys.margin(high), probeOrder);
  const probe = (theta: number) => {
    if (!(theta > low && theta < high)) return;
    const below = keys.countBelow(theta - keys.margin(theta), probeOrder);
    if (below > first) [high, highCount] = [theta, below];
    else {
      [low, count] = [theta, below];
      order.set(probeOrder);
    }
  };
  const at = (rank: number) => low + Math.min(1, Math.max(0, (rank - count) / (highCount - count))) * (high - low);
  for (let round = 0; round < 64 && highCount - count > most; round++) {
    if (high - low <= 8 * (keys.margin(low) + keys.margin(high))) break;
    const before = highCount - count;
    const pad = Math.max(most / 4, before / 16);
    probe(at(first + 0.5 - pad));
    probe(at(second + 0.5 + pad));
    if (highCount - count > before / 2) probe((low + high) / 2);
  }
  return [low, high, count];
}

/** With `countBelow` slopes under the listing's lower bound: ranks first and second, or null when the listing missed them. */
function pick(listing: Listing, countBelow: number, first: number, second: number, limit: number): [number, number] | null {
  const start = countBelow + listing.below;
  if (start > first || second >= start + listing.inside) return null;
  if (listing.inside > limit) return listing.mixed ? null : [listing.single, listing.single];
  const [a, b] = selectPairByBuckets(listing.slopes, first - start, listing.inside);
  return second === first ? [a, a] : [a, b];
}

/** Positive slopes among SAMPLE_SIZE pseudo-random pairs with distinct x (xorshift32, fixed seed: it only guides the search). */
function positiveSample({ xs, ys, n }: SlopeKeys): Float64Array {
  const sample = sampleBuffer;
  let state = (0x9e3779b9 ^ n) | 0;
  let count = 0;
  for (let tries = 0; tries < SAMPLE_SIZE; tries++) {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const a = (((state >>> 0) * n) / 4294967296) | 0;
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const b = (((state >>> 0) * n) / 4294967296) | 0;
    if (xs[a] === xs[b]) continue;
    const slope = (ys[b] - ys[a]) / (xs[b] - xs[a]);
    if (slope > 0) sample[count++] = slope;
  }
  return sample.subarray(0, count);
}
