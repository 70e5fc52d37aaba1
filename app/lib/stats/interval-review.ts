import type { Outcome } from "./requirement";

export type IntervalRecommendation = "extend" | "keep" | "shorten";

/** ILAC-G24 / OIML D 10 method 1 quotes "within e.g. 80 % of the mpe" as the condition to extend. */
export const DEFAULT_EXTEND_UTILISATION = 0.8;
/** Consecutive in-tolerance checks before a longer interval is suggested (common practice, no document). */
export const DEFAULT_EXTEND_AFTER = 5;

export interface IntervalReviewInput {
  /** Outcomes since the latest reset, oldest first. */
  outcomes: readonly Outcome[];
  /** |result|/T of the same checks, oldest first; optional. */
  utilisation?: readonly number[];
  /** Statistical signals (run rules, EWMA, CUSUM) since the latest reset. */
  signalCount: number;
  /** Days from now until the forecast reaches the tolerance (line or prediction bound), null when none. */
  daysToTolerance: number | null;
  intervalDays: number;
  extendAfter?: number;
  extendUtilisation?: number;
}

export interface IntervalReview {
  recommendation: IntervalRecommendation;
  reason: string;
}

const APPROVAL = "A metrologist approves any change under the site's quality system.";

/** Interval review (method 1 staircase plus method 2 control chart ideas): shorten after an out-of-tolerance result or a forecast within one interval; extend after `extendAfter` consecutive in-tolerance checks within 80 % of T with no signal and no forecast within two intervals; otherwise keep. No checks → keep. */
export function reviewInterval(input: IntervalReviewInput): IntervalReview {
  const { outcomes, signalCount, daysToTolerance, intervalDays } = input;
  const extendAfter = input.extendAfter ?? DEFAULT_EXTEND_AFTER;
  const maxUtilisation = input.extendUtilisation ?? DEFAULT_EXTEND_UTILISATION;
  const latest = outcomes.at(-1);
  if (latest === undefined) return { recommendation: "keep", reason: `No checks are recorded since the latest reset. ${APPROVAL}` };
  if (latest === "out_of_tolerance") {
    return {
      recommendation: "shorten",
      reason: `The latest check was out of tolerance: shorten the interval and assess the weighings since the last good check. ${APPROVAL}`,
    };
  }
  if (daysToTolerance !== null && daysToTolerance <= intervalDays) {
    return {
      recommendation: "shorten",
      reason: `The forecast reaches the tolerance limit in ${days(daysToTolerance)}, within the current interval of ${days(intervalDays)}. ${APPROVAL}`,
    };
  }
  let streak = 0;
  while (streak < outcomes.length && outcomes[outcomes.length - 1 - streak] === "in_tolerance") streak++;
  const utilisation = streak === 0 ? [] : (input.utilisation?.slice(-streak) ?? []);
  const tooClose = utilisation.filter((u) => u > maxUtilisation).length;
  const blockers: string[] = [];
  if (streak < extendAfter) {
    blockers.push(streak === 0 ? "the latest check was not within acceptance" : `only ${streak} of the ${extendAfter} consecutive checks within acceptance needed to extend`);
  }
  if (tooClose > 0) blockers.push(`${tooClose} of them used more than ${Math.round(maxUtilisation * 100)} % of the tolerance`);
  if (signalCount > 0) blockers.push(`${signalCount} statistical ${signalCount === 1 ? "signal" : "signals"} since the latest reset`);
  if (daysToTolerance !== null && daysToTolerance <= 2 * intervalDays) {
    blockers.push(`the forecast reaches the tolerance limit in ${days(daysToTolerance)}, within two intervals`);
  }
  if (blockers.length > 0) return { recommendation: "keep", reason: `Keep the interval: ${blockers.join("; ")}. ${APPROVAL}` };
  return {
    recommendation: "extend",
    reason: `The last ${streak} checks were within acceptance and within ${Math.round(maxUtilisation * 100)} % of the tolerance, with no statistical signal and no forecast crossing within two intervals, so a longer interval may be justified. ${APPROVAL}`,
  };
}

function days(value: number): string {
  const whole = Math.max(0, Math.round(value));
  return `${whole} ${whole === 1 ? "day" : "days"}`;
}
