import { predict, predictionHalfWidth, type LinearFit } from "./ols";

export interface ToleranceBand {
  upper?: number;
  lower?: number;
  /** Guard band G: acceptance limits lie G inside the tolerance limits (JCGM 106); default 0. */
  guardBand?: number;
}

/** Crossings on the trend axis (days or points); null where none is forecast. */
export interface CrossingForecast {
  acceptanceAt: number | null;
  toleranceAt: number | null;
  earliestToleranceAt: number | null;
}

export const DEFAULT_FORECAST_HORIZON = 365;

/** Where the fitted line reaches the acceptance and tolerance limit it heads for (only when p < 0.05; may lie before `from` if the line has already passed it), and the earliest x in [from, from + horizon] where the 95 % prediction bound reaches a tolerance limit (`from` itself if it already does); null when not applicable. */
export function forecastCrossings(
  fit: LinearFit,
  band: ToleranceBand,
  from: number,
  horizon = DEFAULT_FORECAST_HORIZON,
  significance = 0.05,
): CrossingForecast {
  const guard = band.guardBand ?? 0;
  const heading = fit.slope > 0 ? band.upper : fit.slope < 0 ? band.lower : undefined;
  const significant = fit.pValue < significance && heading !== undefined;
  const lineReaches = (limit: number) => (limit - fit.intercept) / fit.slope;
  const acceptance = heading === undefined ? undefined : fit.slope > 0 ? heading - guard : heading + guard;
  const { upper, lower } = band;
  const bounds: number[] = [];
  if (upper !== undefined) bounds.push(earliestReach((x) => predict(fit, x) + predictionHalfWidth(fit, x) - upper, from, from + horizon));
  if (lower !== undefined) bounds.push(earliestReach((x) => lower - predict(fit, x) + predictionHalfWidth(fit, x), from, from + horizon));
  const reached = bounds.filter((x) => !Number.isNaN(x));
  return {
    acceptanceAt: significant && acceptance !== undefined ? lineReaches(acceptance) : null,
    toleranceAt: significant && heading !== undefined ? lineReaches(heading) : null,
    earliestToleranceAt: reached.length > 0 ? Math.min(...reached) : null,
  };
}

/** Smallest x in [from, to] with gap(x) ≥ 0 for a convex gap (the prediction bound is a hyperbola), NaN if none. */
function earliestReach(gap: (x: number) => number, from: number, to: number): number {
  if (!(gap(from) < 0)) return Number.isNaN(gap(from)) ? Number.NaN : from;
  if (!(gap(to) >= 0)) return Number.NaN;
  let low = from;
  let high = to;
  for (let i = 0; i < 60 && high - low > 1e-9 * (1 + Math.abs(high)); i++) {
    const middle = (low + high) / 2;
    if (gap(middle) >= 0) high = middle;
    else low = middle;
  }
  return high;
}
