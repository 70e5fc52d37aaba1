import { D2_INDIVIDUALS } from "./control-constants";
import { summarize } from "./summary";

export const DEFAULT_BASELINE_COUNT = 20;
export const MIN_BASELINE_COUNT = 8;
/** USP <41>: below 0.41·d a standard deviation is an artefact of rounding to the readability d. */
export const ROUNDING_SD_FACTOR = 0.41;

export type BaselineSpec = { count: number } | { center: number; sigma: number };

export interface Baseline {
  count: number;
  center: number;
  sigma: number;
  /** How σ̂ was found: from moving ranges, raised to 0.41·d, or given by the caller. */
  sigmaSource: "moving-range" | "resolution-floor" | "given";
}

export interface ControlLimits {
  center: number;
  sigma: number;
  ucl: number;
  lcl: number;
  uwl: number;
  lwl: number;
  upperOneSigma: number;
  lowerOneSigma: number;
}

/** Mean moving range MR̄ = Σ|xᵢ − xᵢ₋₁|/(n − 1) of the first `count` values; NaN for fewer than 2. */
export function meanMovingRange(values: ArrayLike<number>, count = values.length): number {
  const n = Math.min(count, values.length);
  if (n < 2) return Number.NaN;
  let total = 0;
  for (let i = 1; i < n; i++) total += Math.abs(values[i] - values[i - 1]);
  return total / (n - 1);
}

/** Baseline from the first `count` points (default 20): centre = mean, σ̂ = MR̄/1.128, raised to 0.41·d when d is given; or the caller's centre and σ̂. Null when fewer than 8 points, a count < 8, or σ̂ is 0 or not finite. */
export function estimateBaseline(
  values: ArrayLike<number>,
  spec: BaselineSpec = { count: DEFAULT_BASELINE_COUNT },
  resolution?: number,
): Baseline | null {
  if ("center" in spec) {
    if (!Number.isFinite(spec.center) || !(spec.sigma > 0 && Number.isFinite(spec.sigma))) return null;
    return { count: 0, center: spec.center, sigma: spec.sigma, sigmaSource: "given" };
  }
  const count = Math.min(Math.floor(spec.count), values.length);
  if (!(count >= MIN_BASELINE_COUNT)) return null;
  const head = Array.prototype.slice.call(values, 0, count) as number[];
  const center = summarize(head).mean;
  const fromRanges = meanMovingRange(head) / D2_INDIVIDUALS;
  const floor = resolution !== undefined && resolution > 0 ? ROUNDING_SD_FACTOR * resolution : 0;
  const sigma = Math.max(fromRanges, floor);
  if (!(sigma > 0 && Number.isFinite(sigma))) return null;
  return { count, center, sigma, sigmaSource: fromRanges >= floor ? "moving-range" : "resolution-floor" };
}

/** Limits centre ± 3σ̂ (ucl/lcl), ± 2σ̂ (uwl/lwl) and ± 1σ̂, in the units of the values. */
export function controlLimits(baseline: { center: number; sigma: number }): ControlLimits {
  const { center, sigma } = baseline;
  return {
    center,
    sigma,
    ucl: center + 3 * sigma,
    lcl: center - 3 * sigma,
    uwl: center + 2 * sigma,
    lwl: center - 2 * sigma,
    upperOneSigma: center + sigma,
    lowerOneSigma: center - sigma,
  };
}
