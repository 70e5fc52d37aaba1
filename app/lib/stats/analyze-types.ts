import type { CusumOptions } from "./cusum";
import type { EwmaOptions } from "./ewma";
import type { ToleranceBand } from "./forecast";
import type { BaselineSpec } from "./limits";
import type { RuleId, RuleSetName, RunRuleOptions } from "./run-rules";

export type PointSignalId = RuleId | "ewma" | "cusum-high" | "cusum-low";

export interface AnalyzeSeriesInput {
  /** Values in time order (excluded points already removed). */
  values: readonly number[];
  /** ISO 8601 dates or date-times with an offset, same length, not decreasing; without them the trend is per point. */
  times?: readonly string[];
  /** The same times as epoch milliseconds (UTC), for bulk callers that skip ISO parsing; give `times` or `timesMs`, not both. */
  timesMs?: ArrayLike<number>;
  /** Readability d: σ̂ is never taken below 0.41·d. */
  resolution?: number;
  baseline?: BaselineSpec;
  rules?: RuleSetName | "none" | readonly RuleId[];
  ruleOptions?: Partial<RunRuleOptions>;
  ewma?: EwmaOptions | false;
  cusum?: CusumOptions | false;
  tolerance?: ToleranceBand;
  /** Forecast horizon in days (with times) or points (without), default 365. */
  forecastHorizon?: number;
}

export interface AnalyzedPoint {
  index: number;
  value: number;
  signals: readonly PointSignalId[];
  ewma: number | null;
  ewmaUcl: number | null;
  ewmaLcl: number | null;
  cusumHigh: number | null;
  cusumLow: number | null;
}

export interface SeriesSignal {
  rule: PointSignalId;
  index: number;
  message: string;
}

export interface SeriesAnalysis {
  n: number;
  /** NaN (null in JSON) where undefined: mean of no values, sd and lag1 of fewer than 2 or of constant values. */
  summary: { mean: number; sd: number; lag1: number };
  baseline: { count: number; center: number; sigma: number } | null;
  limits: { ucl: number; lcl: number; uwl: number; lwl: number; upperOneSigma: number; lowerOneSigma: number } | null;
  points: AnalyzedPoint[];
  /** One entry per episode: the first point of each run of consecutive firing points, by index then rule. */
  signals: SeriesSignal[];
  trend: {
    slope: number;
    slopeLow: number;
    slopeHigh: number;
    pValue: number;
    theilSen: number;
    mannKendallP: number;
    per: "day" | "point";
  } | null;
  /**
   * With times: ISO 8601 UTC instants. Without: fractional point indexes on the same axis as `index`
   * (e.g. 57.3 = between points 57 and 58). Null without a tolerance or a trend.
   */
  forecast: { acceptanceAt: string | number | null; toleranceAt: string | number | null; earliestToleranceAt: string | number | null } | null;
  warnings: string[];
}
