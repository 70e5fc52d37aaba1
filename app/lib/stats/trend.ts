import { fitLine, type LinearFit } from "./ols";
import { theilSenAndMannKendall } from "./theil-sen";

export interface TrendResult {
  /** OLS slope in value units per day (or per point). */
  slope: number;
  slopeLow: number;
  slopeHigh: number;
  pValue: number;
  theilSen: number;
  mannKendallP: number;
  per: "day" | "point";
  fit: LinearFit;
}

/** Trend of y on x: OLS slope with its 95 % t interval (n − 2 df) and p-value, Theil–Sen slope and Mann–Kendall p-value (tie-corrected); null for fewer than 3 points or when all x are equal. */
export function analyzeTrend(x: ArrayLike<number>, y: ArrayLike<number>, per: "day" | "point"): TrendResult | null {
  if (Math.min(x.length, y.length) < 3) return null;
  const fit = fitLine(x, y);
  if (fit === null) return null;
  const robust = theilSenAndMannKendall(x, y);
  return {
    slope: fit.slope,
    slopeLow: fit.slopeLow,
    slopeHigh: fit.slopeHigh,
    pValue: fit.pValue,
    theilSen: robust.theilSen,
    mannKendallP: robust.mannKendall.pValue,
    per,
    fit,
  };
}
