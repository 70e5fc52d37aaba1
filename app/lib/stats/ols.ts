import { studentTQuantile, twoSidedTPValue } from "./distributions";

export interface LinearFit {
  n: number;
  slope: number;
  intercept: number;
  /** Confidence interval of the slope (default 95 %), Student t with n − 2 df; NaN for n = 2. */
  slopeLow: number;
  slopeHigh: number;
  slopeStandardError: number;
  /** Two-sided p-value of slope = 0; NaN for n = 2. */
  pValue: number;
  /** Residual standard deviation √(SSE/(n − 2)). */
  residualSd: number;
  xMean: number;
  sxx: number;
  /** t(1 − α/2; n − 2) used for the interval and for prediction bounds. */
  tCritical: number;
}

/** Ordinary least squares y = a + b·x (centred two-pass sums), b in y-units per x-unit, with its t interval and p-value; null for n < 2 or when all x are equal; a perfect fit has se = 0 and p = 0 (p = 1 if b = 0 too). */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, confidence = 0.95): LinearFit | null {
  const n = Math.min(x.length, y.length);
  if (n < 2) return null;
  let xMean = 0;
  let yMean = 0;
  for (let i = 0; i < n; i++) {
    xMean += x[i];
    yMean += y[i];
  }
  xMean /= n;
  yMean /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - xMean;
    sxx += dx * dx;
    sxy += dx * (y[i] - yMean);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  const intercept = yMean - slope * xMean;
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const residual = y[i] - (yMean + slope * (x[i] - xMean));
    sse += residual * residual;
  }
  const df = n - 2;
  const residualSd = df > 0 ? Math.sqrt(sse / df) : Number.NaN;
  const slopeStandardError = residualSd / Math.sqrt(sxx);
  const tCritical = studentTQuantile(1 - (1 - confidence) / 2, df);
  const tStatistic = slopeStandardError > 0 ? slope / slopeStandardError : slope === 0 ? 0 : Math.sign(slope) * Infinity;
  return {
    n,
    slope,
    intercept,
    slopeLow: slope - tCritical * slopeStandardError,
    slopeHigh: slope + tCritical * slopeStandardError,
    slopeStandardError,
    pValue: df > 0 ? twoSidedTPValue(tStatistic, df) : Number.NaN,
    residualSd,
    xMean,
    sxx,
    tCritical,
  };
}

/** Fitted value a + b·x of a line. */
export function predict(fit: LinearFit, x: number): number {
  return fit.intercept + fit.slope * x;
}

/** Half-width t·s·√(1 + 1/n + (x − x̄)²/Sxx) of the prediction interval for one new observation at x; NaN for n = 2. */
export function predictionHalfWidth(fit: LinearFit, x: number): number {
  const dx = x - fit.xMean;
  return fit.tCritical * fit.residualSd * Math.sqrt(1 + 1 / fit.n + (dx * dx) / fit.sxx);
}
