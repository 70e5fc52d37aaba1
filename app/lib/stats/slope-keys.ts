import { inversionCounter } from "./inversions";
import { Scratch } from "./scratch";

const UNIT_ROUNDOFF = 2 ** -53;

/** Largest |x| and |y| and the smallest gap between distinct x: they bound the rounding of the keys y − θx. */
export interface PointScale {
  xMax: number;
  yMax: number;
  gap: number;
  /** False when slopes could leave the normal float range: the bound of `margin` then fails. */
  exact: boolean;
}

/** What a listing found: pairs swapped, those judged below `low`, those in [low, high] (stored up to the limit), and whether the latter differ. */
export interface Listing {
  swaps: number;
  below: number;
  inside: number;
  single: number;
  mixed: boolean;
  /** The first min(inside, limit) slopes in [low, high], in no particular order (scratch: valid until the next listing). */
  slopes: Float64Array;
}

// Keys and the listing buffer of the selection in progress; the buffer reaches hundreds of kilobytes.
const scratch = new Scratch();
let listBuffer: Float64Array = new Float64Array(1 << 12);

/**
 * Slopes through key orders. For x-sorted points slope(i, j) < θ exactly when yⱼ − θxⱼ < yᵢ − θxᵢ, so the inversions
 * of the keys y − θx count the slopes below θ, and re-sorting the order at one θ by the keys at another swaps each
 * pair whose slope lies between them exactly once. Float keys can misjudge a slope within `margin(θ)` of θ: callers
 * keep bounds on computed slopes a margin inside key thresholds, and listings judge each pair by its computed slope.
 */
export class SlopeKeys {
  readonly n: number;
  private readonly keys: Float64Array;

  constructor(readonly xs: Float64Array, readonly ys: Float64Array, private readonly scale: PointScale) {
    this.n = xs.length;
    this.keys = scratch.float64(0, this.n);
  }

  /** Inversions of y − θx, that is the slopes below θ up to the margin, with the sorted order in `into`. */
  countBelow(theta: number, into: Int32Array): number {
    this.keysAt(theta);
    return inversionCounter(this.n).sortCountingInversions(this.keys, this.n, into);
  }

  /** The keys y − θx, or −x for θ = ∞ (a loop of its own, compiled apart from its callers' loops). */
  private keysAt(theta: number): void {
    const { xs, ys, keys, n } = this;
    for (let i = 0; i < n; i++) keys[i] = theta === Infinity ? -xs[i] : ys[i] - theta * xs[i];
  }

  /**
   * Four times the widest gap between a key comparison at θ and the computed slope: each key y − θx is off by at most
   * u(|y| + 2|θx|), two of them over the smallest x gap, plus the 3u relative rounding of the slope itself (u = 2⁻⁵³).
   */
  margin(theta: number): number {
    const { xMax, yMax, gap } = this.scale;
    const keyError = UNIT_ROUNDOFF * (yMax + 2 * Math.abs(theta) * xMax) + 2 * Number.MIN_VALUE;
    return 4 * ((2 * keyError) / gap + 4 * UNIT_ROUNDOFF * Math.abs(theta));
  }

  /**
   * Re-sorts `order` by the keys y − θx (by −x for θ = ∞) with an insertion sort whose every swap is one pair: judged
   * by its computed slope (yⱼ − yᵢ)/(xⱼ − xᵢ), it is counted below `low`, stored when in [low, high] (up to `limit`), or
   * left out. The order is then the order at θ.
   */
  list(order: Int32Array, theta: number, low: number, high: number, limit: number): Listing {
    const { xs, ys, n, keys } = this;
    this.keysAt(theta);
    let out = listBuffer;
    let swaps = 0;
    let below = 0;
    let inside = 0;
    let single = Number.NaN;
    let mixed = false;
    for (let position = 1; position < n; position++) {
      const current = order[position];
      const key = keys[current];
      let p = position - 1;
      for (; p >= 0 && keys[order[p]] > key; p--) {
        const other = order[p];
        const slope = (ys[current] - ys[other]) / (xs[current] - xs[other]);
        order[p + 1] = other;
        swaps++;
        if (slope < low) below++;
        else if (slope <= high) {
          if (inside < limit) {
            if (inside === out.length) out = listBuffer = grown(out);
            out[inside] = slope;
          }
          if (inside++ === 0) single = slope;
          else mixed ||= slope !== single;
        }
      }
      order[p + 1] = current;
    }
    return { swaps, below, inside, single, mixed, slopes: out.subarray(0, Math.min(inside, limit)) };
  }

  /** Just above the largest slope, which lies between neighbouring x-groups. */
  maxSlope(): number {
    const { xs, ys, n } = this;
    let high = 0;
    for (let start = 0, end = 0, previous = -1; start < n; previous = start, start = end) {
      while (end < n && xs[end] === xs[start]) end++;
      if (previous >= 0) high = Math.max(high, (ys[end - 1] - ys[previous]) / (xs[start] - xs[previous]));
    }
    return high * (1 + 1e-9) + this.margin(high);
  }
}

/** Scale of x-sorted points, or null when a value is not finite; see `PointScale.exact`. */
export function pointScale(xs: Float64Array, ys: Float64Array): PointScale | null {
  const n = xs.length;
  let xMax = 0;
  let yMax = 0;
  let yMin = Infinity;
  let gap = Infinity;
  for (let i = 0; i < n; i++) {
    if (!(Number.isFinite(xs[i]) && Number.isFinite(ys[i]))) return null;
    const y = Math.abs(ys[i]);
    xMax = Math.max(xMax, Math.abs(xs[i]));
    yMax = Math.max(yMax, y);
    if (y > 0) yMin = Math.min(yMin, y);
    if (i > 0 && xs[i] > xs[i - 1]) gap = Math.min(gap, xs[i] - xs[i - 1]);
  }
  // No overflow of |Δy|/gap, and no underflow of the smallest non-zero |Δy| ≥ u·min|y| over the whole x span.
  const span = xs[n - 1] - xs[0];
  const exact = (yMax * (xMax + 1)) / gap < 2 ** 900 && !(yMin < Infinity && (yMin * UNIT_ROUNDOFF) / span < 2 ** -1000);
  return { xMax, yMax, gap, exact };
}

function grown(buffer: Float64Array): Float64Array {
  const larger = new Float64Array(2 * buffer.length);
  larger.set(buffer);
  return larger;
}
