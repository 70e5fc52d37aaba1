import type { AnalyzedPoint, AnalyzeSeriesInput, PointSignalId, SeriesAnalysis } from "./analyze-types";
import { DEFAULT_CUSUM, tabularCusum, type CusumResult } from "./cusum";
import { DEFAULT_EWMA, ewmaChart, type EwmaResult } from "./ewma";
import { DEFAULT_FORECAST_HORIZON, forecastCrossings, type ToleranceBand } from "./forecast";
import type { LinearFit } from "./ols";
import { controlLimits, DEFAULT_BASELINE_COUNT, estimateBaseline, MIN_BASELINE_COUNT } from "./limits";
import { describeRule } from "./rule-messages";
import { DEFAULT_RUN_RULE_OPTIONS, evaluateRunRules, resolveRules, type RuleFiring } from "./run-rules";
import { collectSignals, type SignalChannel } from "./series-signals";
import { autocorrelationWarning, summarize } from "./summary";
import { daysSinceFirst, daysSinceFirstMs, isoAfterFirstMs, parseIsoInstant, pointAxis } from "./time-axis";
import { analyzeTrend } from "./trend";

export type * from "./analyze-types";

/** Whole-series analysis: summary, baseline and limits (≥ 8 baseline points, else null with a warning), run rules, EWMA, CUSUM, trend (per day with times, else per point; ≥ 3 points) and forecast against a tolerance. Times as ISO strings or epoch ms give the same result. Throws RangeError for unparseable or decreasing times, a times/values length mismatch, or both kinds of times. */
export function analyzeSeries(input: AnalyzeSeriesInput): SeriesAnalysis {
  const { values, times, timesMs } = input;
  const n = values.length;
  if (times && timesMs) throw new RangeError("Give times or timesMs, not both");
  const stamps = times ?? timesMs;
  if (stamps && stamps.length !== n) throw new RangeError(`times has ${stamps.length} entries for ${n} values`);
  const axis = times ? daysSinceFirst(times) : timesMs ? daysSinceFirstMs(timesMs) : pointAxis(n);
  const warnings: string[] = [];
  const { mean, sd, lag1 } = summarize(values);
  const lagWarning = autocorrelationWarning(lag1);
  if (lagWarning) warnings.push(lagWarning);

  const baseline = estimateBaseline(values, input.baseline, input.resolution);
  if (baseline === null) warnings.push(baselineWarning(input, n));
  else if (baseline.sigmaSource === "resolution-floor") {
    warnings.push("The moving-range σ̂ was below 0.41·d, so 0.41·d was used: the readings mostly repeat at the readability.");
  }
  const limits = baseline && controlLimits(baseline);
  const options = { ...DEFAULT_RUN_RULE_OPTIONS, ...input.ruleOptions };
  const rules = limits ? resolveRules(input.rules) : [];
  const firings = limits ? evaluateRunRules(values, limits, rules, options) : new Map<never, RuleFiring>();
  const ewma = baseline && input.ewma !== false ? ewmaChart(values, baseline.center, baseline.sigma, input.ewma ?? DEFAULT_EWMA) : null;
  const cusum = baseline && input.cusum !== false ? tabularCusum(values, baseline.center, baseline.sigma, input.cusum ?? DEFAULT_CUSUM) : null;

  const channels: SignalChannel[] = [];
  for (const [rule, firing] of firings) channels.push([rule, firing, (direction) => describeRule(rule, direction, options)]);
  if (ewma) channels.push(["ewma", ewma.signal, (d) => `EWMA beyond its ${d < 0 ? "lower" : "upper"} control limit`]);
  if (cusum) {
    channels.push(["cusum-high", cusum.signalHigh, () => "Upper CUSUM above the decision interval: the mean has probably shifted up"]);
    channels.push(["cusum-low", cusum.signalLow, () => "Lower CUSUM above the decision interval: the mean has probably shifted down"]);
  }
  const { pointSignals, signals } = collectSignals(channels, n);

  const trend = analyzeTrend(axis, values, stamps ? "day" : "point");
  const forecast = trend && input.tolerance ? formatForecast(input, input.tolerance, trend.fit, axis) : null;
  return {
    n,
    summary: { mean, sd, lag1 },
    baseline: baseline && { count: baseline.count, center: baseline.center, sigma: baseline.sigma },
    limits: limits && { ucl: limits.ucl, lcl: limits.lcl, uwl: limits.uwl, lwl: limits.lwl, upperOneSigma: limits.upperOneSigma, lowerOneSigma: limits.lowerOneSigma },
    points: buildPoints(values, pointSignals, ewma, cusum),
    signals,
    trend: trend && {
      slope: trend.slope,
      slopeLow: trend.slopeLow,
      slopeHigh: trend.slopeHigh,
      pValue: trend.pValue,
      theilSen: trend.theilSen,
      mannKendallP: trend.mannKendallP,
      per: trend.per,
    },
    forecast,
    warnings,
  };
}

function baselineWarning(input: AnalyzeSeriesInput, n: number): string {
  const spec = input.baseline;
  if (spec && "center" in spec) return "The given baseline needs a finite centre and a σ̂ above 0, so no limits were computed.";
  const count = Math.min(spec?.count ?? DEFAULT_BASELINE_COUNT, n);
  if (count < MIN_BASELINE_COUNT) {
    return `The baseline has ${count} ${count === 1 ? "point" : "points"}; at least ${MIN_BASELINE_COUNT} are needed, so no limits, run rules, EWMA or CUSUM were computed.`;
  }
  return "The baseline points do not vary and no readability d was given, so no limits, run rules, EWMA or CUSUM were computed.";
}

function buildPoints(values: readonly number[], pointSignals: (readonly PointSignalId[])[], ewma: EwmaResult | null, cusum: CusumResult | null): AnalyzedPoint[] {
  const points: AnalyzedPoint[] = new Array(values.length);
  for (let i = 0; i < values.length; i++) {
    points[i] = {
      index: i,
      value: values[i],
      signals: pointSignals[i],
      ewma: ewma ? ewma.z[i] : null,
      ewmaUcl: ewma ? ewma.ucl[i] : null,
      ewmaLcl: ewma ? ewma.lcl[i] : null,
      cusumHigh: cusum ? cusum.high[i] : null,
      cusumLow: cusum ? cusum.low[i] : null,
    };
  }
  return points;
}

function formatForecast(input: AnalyzeSeriesInput, tolerance: ToleranceBand, fit: LinearFit, axis: Float64Array): SeriesAnalysis["forecast"] {
  const crossing = forecastCrossings(fit, tolerance, axis[axis.length - 1], input.forecastHorizon ?? DEFAULT_FORECAST_HORIZON);
  const first = input.times ? parseIsoInstant(input.times[0]) : input.timesMs?.[0];
  const express = (x: number | null) => (x === null ? null : first === undefined ? x : isoAfterFirstMs(first, x));
  return {
    acceptanceAt: express(crossing.acceptanceAt),
    toleranceAt: express(crossing.toleranceAt),
    earliestToleranceAt: express(crossing.earliestToleranceAt),
  };
}
