import { codeInversions, gridCodes, sortByCode } from "./grid-sort";
import { inversionCounter } from "./inversions";
import { mannKendall, mannKendallFromTies, type MannKendallResult } from "./mann-kendall";
import { Scratch } from "./scratch";
import { medianInPlace } from "./select";
import { medianSlope, pointScale, type SearchTuning, type ZeroSplit } from "./slope-selection";

const BRUTE_FORCE_PAIRS = 20_000;
// The sorted points and the y order live here for the length of one call.
const scratch = new Scratch();
/** Beyond this many pairs, values too extreme for the rounding bounds of slope selection still go through it. */
const BRUTE_FORCE_FALLBACK_PAIRS = 1 << 22;

interface SortedPoints {
  xs: Float64Array;
  ys: Float64Array;
  /** True when the input already was in x-then-y order, so xs and ys are the input. */
  ordered: boolean;
}

/** Theil–Sen slope: median of (yⱼ − yᵢ)/(xⱼ − xᵢ) over pairs with xᵢ ≠ xⱼ (mean of the two middle slopes for an even count), in y-units per x-unit, exactly as that definition computes it; NaN for fewer than two distinct x or any non-finite value. Beyond 20 000 pairs by exact slope selection: a sort placing slope 0, then a listing of the pairs near the median. */
export function theilSenSlope(x: ArrayLike<number>, y: ArrayLike<number>): number {
  return medianPairwiseSlope(sortedByXThenY(x, y, Math.min(x.length, y.length)));
}

/** `theilSenSlope` with the selection's knobs set, for tests that reach its fallback paths; always by selection when above 0 or below 0. */
export function theilSenSlopeTuned(x: ArrayLike<number>, y: ArrayLike<number>, tuning: SearchTuning): number {
  return medianPairwiseSlope(sortedByXThenY(x, y, Math.min(x.length, y.length)), undefined, tuning);
}

/** Theil–Sen slope of y on x and the Mann–Kendall test of y, as `theilSenSlope` and `mannKendall` give them; for time-ordered input one sort of y serves both (its inversions are the negative slopes, its ties the zero ones), by counting when the readings sit on a decimal grid. */
export function theilSenAndMannKendall(x: ArrayLike<number>, y: ArrayLike<number>): { theilSen: number; mannKendall: MannKendallResult } {
  const points = sortedByXThenY(x, y, Math.min(x.length, y.length));
  if (!points.ordered || points.ys.length !== y.length || y.length < 2) return { theilSen: medianPairwiseSlope(points), mannKendall: mannKendall(y) };
  const split = zeroSplit(points.xs, points.ys);
  return { theilSen: medianPairwiseSlope(points, split), mannKendall: mannKendallFromTies(y.length, split.below, split.ties) };
}

function medianPairwiseSlope({ xs, ys }: SortedPoints, split?: ZeroSplit, tuning?: SearchTuning): number {
  const n = xs.length;
  let pairs = (n * (n - 1)) / 2;
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && xs[end] === xs[start]) end++;
    pairs -= ((end - start) * (end - start - 1)) / 2;
  }
  if (pairs === 0) return Number.NaN;
  const scale = pointScale(xs, ys);
  if (scale === null) return Number.NaN;
  if ((pairs <= BRUTE_FORCE_PAIRS && !tuning) || (!scale.exact && pairs <= BRUTE_FORCE_FALLBACK_PAIRS)) return medianInPlace(allSlopes(xs, ys, pairs));
  return medianSlope(xs, ys, pairs, split ?? zeroSplit(xs, ys), scale, tuning);
}

/** Slope 0 placed exactly: y-inversions of x-sorted points are the negative slopes (pairs of equal x are never inverted), y-ties less x-and-y ties the zero ones; also the tie groups of y, ascending. */
function zeroSplit(xs: Float64Array, ys: Float64Array): ZeroSplit & { ties: ArrayLike<number> } {
  const n = xs.length;
  let tiedXY = 0;
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && xs[end] === xs[start] && ys[end] === ys[start]) end++;
    tiedXY += ((end - start) * (end - start - 1)) / 2;
  }
  const grid = gridCodes(ys);
  if (grid) {
    let order: { order: Int32Array; sortedY: Float64Array } | null = null;
    const stableOrder = () => {
      order ??= { order: new Int32Array(n), sortedY: new Float64Array(n) };
      sortByCode(grid, order.order, order.sortedY);
      return order;
    };
    return { below: codeInversions(grid), zero: tiedPairs(grid.counts) - tiedXY, ties: grid.counts, stableOrder };
  }
  const order = scratch.int32(0, n);
  const counter = inversionCounter(n);
  const below = counter.sortCountingInversions(ys, n, order);
  const sortedY = scratch.float64(2, n);
  sortedY.set(counter.sortedKeys(n));
  const ties: number[] = [];
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && sortedY[end] === sortedY[start]) end++;
    ties.push(end - start);
  }
  return { below, zero: tiedPairs(ties) - tiedXY, ties, stableOrder: () => ({ order, sortedY }) };
}

/** Pairs within tie groups of the given sizes, Σ t(t − 1)/2. */
function tiedPairs(groups: ArrayLike<number>): number {
  let pairs = 0;
  for (let g = 0; g < groups.length; g++) pairs += (groups[g] * (groups[g] - 1)) / 2;
  return pairs;
}

/** Points ordered by x, then y within equal x; time-ordered input skips the comparison sort. */
function sortedByXThenY(x: ArrayLike<number>, y: ArrayLike<number>, n: number): SortedPoints {
  let ordered = true;
  for (let i = 1; i < n && ordered; i++) ordered = x[i - 1] < x[i] || (x[i - 1] === x[i] && y[i - 1] <= y[i]);
  const xs = scratch.float64(0, n);
  const ys = scratch.float64(1, n);
  if (ordered) {
    for (let i = 0; i < n; i++) {
      xs[i] = x[i];
      ys[i] = y[i];
    }
    return { xs, ys, ordered };
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => x[a] - x[b] || y[a] - y[b]);
  for (let i = 0; i < n; i++) {
    xs[i] = x[order[i]];
    ys[i] = y[order[i]];
  }
  return { xs, ys, ordered };
}

function allSlopes(xs: Float64Array, ys: Float64Array, pairs: number): Float64Array {
  const slopes = new Float64Array(pairs);
  let count = 0;
  for (let i = 0; i < xs.length; i++) {
    for (let j = i + 1; j < xs.length; j++) if (xs[j] !== xs[i]) slopes[count++] = (ys[j] - ys[i]) / (xs[j] - xs[i]);
  }
  return slopes;
}
