import { Scratch } from "./scratch";

export interface SeriesSummary {
  n: number;
  mean: number;
  sd: number;
  lag1: number;
}

const MAX_GRID_DECIMALS = 10;
const MAX_GRID_UNITS = 2 ** 43;
// The deviations of the series being summarised (written before read).
const scratch = new Scratch();

/** Decimal places p ≤ 10 such that every value is an integer multiple of 10^−p (to 1e−6 of a step); null when none, or for empty input. */
export function decimalGrid(values: ArrayLike<number>): number | null {
  if (values.length === 0) return null;
  for (let p = 0, scale = 1; p <= MAX_GRID_DECIMALS; p++, scale *= 10) {
    let onGrid = true;
    for (let i = 0; i < values.length && onGrid; i++) {
      const units = values[i] * scale;
      // floor(u + 0.5) equals Math.round(u) for |u| ≤ 2⁴³ except within an ulp of a half, which is off grid either way.
      onGrid = Math.abs(units) <= MAX_GRID_UNITS && Math.abs(units - Math.floor(units + 0.5)) <= 1e-6;
    }
    if (onGrid) return p;
  }
  return null;
}

/** n, mean, s (n − 1) and lag-1 autocorrelation in one pass over deviations; NaN where undefined (mean of empty input, s and r₁ of fewer than 2 points, r₁ of zero variance). */
export function summarize(values: ArrayLike<number>): SeriesSummary {
  const n = values.length;
  if (n === 0) return { n, mean: Number.NaN, sd: Number.NaN, lag1: Number.NaN };
  const p = decimalGrid(values);
  // float64 cannot hold 10000000.1 exactly; on a decimal grid the deviations are exact integers.
  const scale = p === null ? 1 : 10 ** p;
  const deviations = scratch.float64(0, n);
  let reference = 0;
  for (let i = 0; i < n; i++) reference += values[i] * scale;
  reference /= n;
  if (p !== null) reference = Math.round(reference);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const units = values[i] * scale;
    // On the grid units lie within 1e−6 of an integer, where floor(u + 0.5) is Math.round(u), and cheaper.
    deviations[i] = (p === null ? units : Math.floor(units + 0.5)) - reference;
    sum += deviations[i];
  }
  const shift = sum / n;
  let squares = 0;
  for (let i = 0; i < n; i++) squares += deviations[i] * deviations[i];
  const centredSquares = centredSumOfSquares(squares, sum, n);
  let lagProducts = 0;
  for (let i = 0; i + 1 < n; i++) lagProducts += (deviations[i] - shift) * (deviations[i + 1] - shift);
  return {
    n,
    mean: (reference + shift) / scale,
    sd: n < 2 ? Number.NaN : Math.sqrt(centredSquares / (n - 1)) / scale,
    lag1: n < 2 || centredSquares === 0 ? Number.NaN : lagProducts / centredSquares,
  };
}

function centredSumOfSquares(squares: number, sum: number, n: number): number {
  const exactProduct = n * squares;
  if (Number.isSafeInteger(exactProduct) && Number.isSafeInteger(sum * sum)) {
    return Math.max(0, (exactProduct - sum * sum) / n);
  }
  return Math.max(0, squares - (sum * sum) / n);
}

/** Warning sentence when |r₁| > threshold (default 0.5): moving-range limits then mislead; null otherwise or when r₁ is NaN. */
export function autocorrelationWarning(lag1: number, threshold = 0.5): string | null {
  if (!(Math.abs(lag1) > threshold)) return null;
  const shown = lag1.toFixed(2);
  return lag1 > 0
    ? `Successive values are strongly correlated (lag-1 autocorrelation ${shown}), so limits from moving ranges are too narrow and will raise false signals.`
    : `Successive values alternate strongly (lag-1 autocorrelation ${shown}), so limits from moving ranges are too wide and can hide a real shift.`;
}
