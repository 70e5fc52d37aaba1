import type { ControlLimits } from "./limits";
import { alternating, bothSidesRun, kOfWindow, steadyTrend, withinRun } from "./run-detectors";
import { runRulePass, type Detector } from "./run-pass";

export const RULE_IDS = [
  "we-1", "we-2", "we-3", "we-4",
  "nelson-1", "nelson-2", "nelson-3", "nelson-4", "nelson-5", "nelson-6", "nelson-7", "nelson-8",
] as const;
export type RuleId = (typeof RULE_IDS)[number];
export type RuleSetName = "nelson" | "western-electric";

export const RULE_SETS: Record<RuleSetName, readonly RuleId[]> = {
  "western-electric": ["we-1", "we-2", "we-3", "we-4"],
  nelson: ["nelson-1", "nelson-2", "nelson-3", "nelson-4", "nelson-5", "nelson-6", "nelson-7", "nelson-8"],
};

/** Run lengths; defaults from Nelson (1984) and the Western Electric handbook (1956), REFERENCE.md §5. */
export interface RunRuleOptions {
  nelsonSameSideRun: number;
  westernElectricSameSideRun: number;
  trendRun: number;
  alternatingRun: number;
  beyondTwoSigma: { count: number; window: number };
  beyondOneSigma: { count: number; window: number };
  withinOneSigmaRun: number;
  bothSidesRun: number;
}

export const DEFAULT_RUN_RULE_OPTIONS: RunRuleOptions = {
  nelsonSameSideRun: 9,
  westernElectricSameSideRun: 8,
  trendRun: 6,
  alternatingRun: 14,
  beyondTwoSigma: { count: 2, window: 3 },
  beyondOneSigma: { count: 4, window: 5 },
  withinOneSigmaRun: 15,
  bothSidesRun: 8,
};

/** Per point: 0 = quiet, 1 = fires above or rising, −1 = below or falling, 2 = fires without a side. */
export type RuleFiring = Int8Array;

/** Tests `isRuleId(x)`: true for the 12 ids we-1…we-4, nelson-1…nelson-8. */
export function isRuleId(value: string): value is RuleId {
  return (RULE_IDS as readonly string[]).includes(value);
}

/** Rule ids for a set name, a list of ids (deduplicated, in order) or 'none' (empty). */
export function resolveRules(rules: RuleSetName | "none" | readonly RuleId[] = "nelson"): RuleId[] {
  if (rules === "none") return [];
  if (typeof rules === "string") return [...RULE_SETS[rules]];
  return [...new Set(rules)];
}

const DETECTORS: Record<RuleId, Detector> = {
  "we-1": "beyondThree",
  "nelson-1": "beyondThree",
  "we-4": "weSameSide",
  "nelson-2": "nelsonSameSide",
  "nelson-3": "trend",
  "nelson-4": "alternating",
  "we-2": "twoOfThree",
  "nelson-5": "twoOfThree",
  "we-3": "fourOfFive",
  "nelson-6": "fourOfFive",
  "nelson-7": "within",
  "nelson-8": "bothSides",
};

/** One firing array per rule over the whole series, per DESIGN §3 (strict inequalities, complete windows only), all in one pass; empty input gives empty arrays. */
export function evaluateRunRules(
  values: ArrayLike<number>,
  limits: ControlLimits,
  rules: readonly RuleId[],
  options: RunRuleOptions = DEFAULT_RUN_RULE_OPTIONS,
): Map<RuleId, RuleFiring> {
  const windows = [options.nelsonSameSideRun, options.westernElectricSameSideRun, options.beyondTwoSigma.window, options.beyondOneSigma.window];
  if (!windows.every((w) => Number.isInteger(w) && w > 0)) return evaluateOneByOne(values, limits, rules, options);
  const firings = runRulePass(values, limits, new Set(rules.map((rule) => DETECTORS[rule])), options);
  const result = new Map<RuleId, RuleFiring>();
  const used = new Set<Detector>();
  for (const rule of rules) {
    const detector = DETECTORS[rule];
    const firing = firings[detector] as RuleFiring;
    // Rules sharing a detector (nelson-1 and we-1) get arrays of their own.
    result.set(rule, used.has(detector) ? firing.slice() : firing);
    used.add(detector);
  }
  return result;
}

/** The detectors one pass each (run-detectors.ts), for window lengths that are not positive whole numbers. */
function evaluateOneByOne(values: ArrayLike<number>, limits: ControlLimits, rules: readonly RuleId[], options: RunRuleOptions): Map<RuleId, RuleFiring> {
  const result = new Map<RuleId, RuleFiring>();
  const { center, ucl, lcl, uwl, lwl, upperOneSigma, lowerOneSigma } = limits;
  for (const rule of rules) {
    switch (rule) {
      case "we-1":
      case "nelson-1":
        result.set(rule, kOfWindow(values, ucl, lcl, 1, 1));
        break;
      case "we-4":
        result.set(rule, kOfWindow(values, center, center, options.westernElectricSameSideRun, options.westernElectricSameSideRun));
        break;
      case "nelson-2":
        result.set(rule, kOfWindow(values, center, center, options.nelsonSameSideRun, options.nelsonSameSideRun));
        break;
      case "nelson-3":
        result.set(rule, steadyTrend(values, options.trendRun));
        break;
      case "nelson-4":
        result.set(rule, alternating(values, options.alternatingRun));
        break;
      case "we-2":
      case "nelson-5":
        result.set(rule, kOfWindow(values, uwl, lwl, options.beyondTwoSigma.count, options.beyondTwoSigma.window));
        break;
      case "we-3":
      case "nelson-6":
        result.set(rule, kOfWindow(values, upperOneSigma, lowerOneSigma, options.beyondOneSigma.count, options.beyondOneSigma.window));
        break;
      case "nelson-7":
        result.set(rule, withinRun(values, lowerOneSigma, upperOneSigma, options.withinOneSigmaRun));
        break;
      case "nelson-8":
        result.set(rule, bothSidesRun(values, lowerOneSigma, upperOneSigma, options.bothSidesRun));
        break;
    }
  }
  return result;
}
