import { ROUNDING_SD_FACTOR } from "./limits";
import { summarize } from "./summary";

/** USP <41>: 2·s / m ≤ 0.10 %, so m_min = 2·s / 0.001 = 2000·s. */
export const USP_COVERAGE_FACTOR = 2;
export const USP_REQUIRED_RELATIVE_ACCURACY = 0.001;
/** Safety factor on the minimum weight: USP <1251> asks for one but gives no number; 2 is common practice. */
export const DEFAULT_SAFETY_FACTOR = 2;

export interface RepeatabilityResult {
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1), g. */
  s: number;
  /** max(s, 0.41·d), g. */
  sEffective: number;
  /** True when 0.41·d replaced a smaller s. */
  floored: boolean;
  /** k·s_eff / r, g. */
  minimumWeight: number;
}

/** Minimum weight m_min = k·s_eff/r in grams (USP <41>: k = 2, r = 0.10 % → 2000·s_eff); NaN for s_eff < 0 or r ≤ 0. */
export function minimumWeight(
  sEffective: number,
  coverageFactor = USP_COVERAGE_FACTOR,
  requiredRelativeAccuracy = USP_REQUIRED_RELATIVE_ACCURACY,
): number {
  if (!(sEffective >= 0) || !(requiredRelativeAccuracy > 0)) return Number.NaN;
  return (coverageFactor * sEffective) / requiredRelativeAccuracy;
}

/** Repeatability of n readings of one load (g): s (n − 1), s_eff = max(s, 0.41·d), m_min = 2000·s_eff by default; n < 2 gives s = NaN and m_min = NaN; zero variance gives s = 0, so s_eff = 0.41·d. */
export function repeatability(
  readings: readonly number[],
  readability: number,
  coverageFactor = USP_COVERAGE_FACTOR,
  requiredRelativeAccuracy = USP_REQUIRED_RELATIVE_ACCURACY,
): RepeatabilityResult {
  const { n, mean, sd } = summarize(readings);
  const floor = ROUNDING_SD_FACTOR * readability;
  const sEffective = Number.isNaN(sd) ? Number.NaN : Math.max(sd, floor);
  return {
    n,
    mean,
    s: sd,
    sEffective,
    floored: sd < floor,
    minimumWeight: minimumWeight(sEffective, coverageFactor, requiredRelativeAccuracy),
  };
}

/** True when a net weight m (g) is at least SF·m_min (SF default 2, common practice); false for NaN inputs. */
export function isFitForNetWeight(netWeight: number, minimumWeightGrams: number, safetyFactor = DEFAULT_SAFETY_FACTOR): boolean {
  return netWeight >= safetyFactor * minimumWeightGrams;
}
