import { inversionCounter } from "./inversions";
import { Scratch } from "./scratch";
import { SlopeKeys, type PointScale } from "./slope-keys";
import { DEFAULT_TUNING, selectPositive, type SearchTuning } from "./slope-search";

export { pointScale, type PointScale } from "./slope-keys";
export type { SearchTuning } from "./slope-search";

/** Slope 0 placed among the slopes of x-sorted points: the y-inversions (slopes < 0), the y-tied pairs with distinct x (slopes = 0), and on demand the stable sort of y. */
export interface ZeroSplit {
  below: number;
  zero: number;
  stableOrder: () => { order: Int32Array; sortedY: Float64Array };
}

// The mirrored y of a selection below 0.
const scratch = new Scratch();

/** Median of the `pairs` slopes (yⱼ − yᵢ)/(xⱼ − xᵢ), xᵢ ≠ xⱼ, of points sorted by x then y (mean of the middle two for an even count), bit for bit the direct definition: the zero split places slope 0 exactly, selection finds the rest. */
export function medianSlope(xs: Float64Array, ys: Float64Array, pairs: number, split: ZeroSplit, scale: PointScale, tuning: SearchTuning = DEFAULT_TUNING): number {
  const first = Math.floor((pairs - 1) / 2);
  const second = Math.floor(pairs / 2);
  const nonPositive = split.below + split.zero;
  const side = (rank: number) => (rank < split.below ? -1 : rank < nonPositive ? 0 : 1);
  const pick = (where: number, low: number, high: number): [number, number] => {
    if (where === 0) return [0, 0];
    if (where > 0) {
      const zeroPlus = () => {
        const { order, sortedY } = split.stableOrder();
        return reverseTieRuns(order, sortedY);
      };
      return selectPositive({ keys: new SlopeKeys(xs, ys, scale), pairs, nonPositive, zeroPlus }, low, high, tuning);
    }
    // Slopes below 0 are the negated slopes above 0 of the mirrored points (x, −y); negation is exact.
    const mirror = mirrored(xs, ys, split);
    const [a, b] = selectPositive({ keys: new SlopeKeys(xs, mirror.ys, scale), pairs, nonPositive: pairs - split.below, zeroPlus: mirror.zeroPlus }, pairs - 1 - high, pairs - 1 - low, tuning);
    return [-b, -a];
  };
  if (side(first) === side(second)) {
    const [low, high] = pick(side(first), first, second);
    return first === second ? low : (low + high) / 2;
  }
  return (pick(side(first), first, first)[0] + pick(side(second), second, second)[0]) / 2;
}

/** The order just above slope 0: the stable y order with each run of equal y reversed (later x first). */
function reverseTieRuns(order: Int32Array, sortedY: Float64Array): Int32Array {
  const result = Int32Array.from(order);
  for (let start = 0, end = 0; start < result.length; start = end) {
    while (end < result.length && sortedY[end] === sortedY[start]) end++;
    result.subarray(start, end).reverse();
  }
  return result;
}

/** Points (x, −y), kept sorted by x then y: runs of equal x are reversed; the order just above 0 comes with them. */
function mirrored(xs: Float64Array, ys: Float64Array, split: ZeroSplit): { ys: Float64Array; zeroPlus: () => Int32Array } {
  const n = xs.length;
  const mirror = scratch.float64(0, n);
  let xTies = false;
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && xs[end] === xs[start]) end++;
    for (let k = start; k < end; k++) mirror[start + end - 1 - k] = -ys[k];
    xTies ||= end - start > 1;
  }
  if (!xTies) return { ys: mirror, zeroPlus: () => Int32Array.from(split.stableOrder().order).reverse() };
  return {
    ys: mirror,
    zeroPlus: () => {
      const order = new Int32Array(n);
      const counter = inversionCounter(n);
      counter.sortCountingInversions(mirror, n, order);
      return reverseTieRuns(order, Float64Array.from(counter.sortedKeys(n)));
    },
  };
}
