import { medianInPlace } from "./select";
import { SlopeSelector } from "./slope-selection";

const BRUTE_FORCE_PAIRS = 20_000;

/** Theil–Sen slope: median of (yⱼ − yᵢ)/(xⱼ − xᵢ) over pairs with xᵢ ≠ xⱼ (mean of the two middle slopes for an even count), in y-units per x-unit; NaN for fewer than two distinct x. Exact for up to 20 000 pairs, else by slope selection (exact unless a block of equal slopes straddles the median: then within 1e−6 of the slope spread). */
export function theilSenSlope(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = Math.min(x.length, y.length);
  const { xs, ys } = sortedByXThenY(x, y, n);
  let pairs = (n * (n - 1)) / 2;
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && xs[end] === xs[start]) end++;
    pairs -= ((end - start) * (end - start - 1)) / 2;
  }
  if (pairs === 0) return Number.NaN;
  if (pairs <= BRUTE_FORCE_PAIRS) return medianInPlace(allSlopes(xs, ys, pairs));
  return new SlopeSelector(xs, ys, pairs).median();
}

/** Points ordered by x, then y within equal x; time-ordered input skips the comparison sort. */
function sortedByXThenY(x: ArrayLike<number>, y: ArrayLike<number>, n: number): { xs: Float64Array; ys: Float64Array } {
  let ordered = true;
  for (let i = 1; i < n && ordered; i++) ordered = x[i - 1] < x[i] || (x[i - 1] === x[i] && y[i - 1] <= y[i]);
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  if (ordered) {
    for (let i = 0; i < n; i++) {
      xs[i] = x[i];
      ys[i] = y[i];
    }
    return { xs, ys };
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => x[a] - x[b] || y[a] - y[b]);
  for (let i = 0; i < n; i++) {
    xs[i] = x[order[i]];
    ys[i] = y[order[i]];
  }
  return { xs, ys };
}

function allSlopes(xs: Float64Array, ys: Float64Array, pairs: number): Float64Array {
  const slopes = new Float64Array(pairs);
  let count = 0;
  for (let i = 0; i < xs.length; i++) {
    for (let j = i + 1; j < xs.length; j++) if (xs[j] !== xs[i]) slopes[count++] = (ys[j] - ys[i]) / (xs[j] - xs[i]);
  }
  return slopes;
}
