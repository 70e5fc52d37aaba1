// The one-pass run rules against the one-detector-per-pass definitions in run-detectors.ts, on seeded data that
// crosses every zone often, with the default run lengths and with others (C).
import { describe, expect, it } from "vitest";
import { controlLimits } from "./limits";
import { alternating, bothSidesRun, kOfWindow, steadyTrend, withinRun } from "./run-detectors";
import { DEFAULT_RUN_RULE_OPTIONS, evaluateRunRules, RULE_IDS, type RuleId, type RunRuleOptions } from "./run-rules";

const limits = controlLimits({ center: 0, sigma: 1 });

function reference(rule: RuleId, values: number[], o: RunRuleOptions): Int8Array {
  const { center, ucl, lcl, uwl, lwl, upperOneSigma: up, lowerOneSigma: low } = limits;
  switch (rule) {
    case "we-1":
    case "nelson-1":
      return kOfWindow(values, ucl, lcl, 1, 1);
    case "we-4":
      return kOfWindow(values, center, center, o.westernElectricSameSideRun, o.westernElectricSameSideRun);
    case "nelson-2":
      return kOfWindow(values, center, center, o.nelsonSameSideRun, o.nelsonSameSideRun);
    case "nelson-3":
      return steadyTrend(values, o.trendRun);
    case "nelson-4":
      return alternating(values, o.alternatingRun);
    case "we-2":
    case "nelson-5":
      return kOfWindow(values, uwl, lwl, o.beyondTwoSigma.count, o.beyondTwoSigma.window);
    case "we-3":
    case "nelson-6":
      return kOfWindow(values, up, low, o.beyondOneSigma.count, o.beyondOneSigma.window);
    case "nelson-7":
      return withinRun(values, low, up, o.withinOneSigmaRun);
    case "nelson-8":
      return bothSidesRun(values, low, up, o.bothSidesRun);
  }
}

/** Values in σ on a coarse grid (so that points sit exactly on zone edges and repeat), with drifts and alternations. */
function seededValues(seed: number, n: number): number[] {
  let state = seed;
  const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return Array.from({ length: n }, (_, i) => {
    const wave = Math.sin(i / (5 + (seed % 17))) * 1.5;
    const zigzag = i % 40 < 16 ? (i % 2 ? 0.6 : -0.6) : 0;
    return Math.round((wave + zigzag + (random() - 0.5) * 2.5) * 4) / 4;
  });
}

const optionSets: [string, RunRuleOptions][] = [
  ["defaults", DEFAULT_RUN_RULE_OPTIONS],
  ["other lengths", { ...DEFAULT_RUN_RULE_OPTIONS, nelsonSameSideRun: 7, trendRun: 3, alternatingRun: 5, beyondTwoSigma: { count: 3, window: 4 }, beyondOneSigma: { count: 2, window: 6 }, withinOneSigmaRun: 4, bothSidesRun: 3 }],
  ["run of 1 and counts above the window", { ...DEFAULT_RUN_RULE_OPTIONS, westernElectricSameSideRun: 1, trendRun: 1, alternatingRun: 1, beyondTwoSigma: { count: 4, window: 3 }, withinOneSigmaRun: 0 }],
  ["fractional lengths (one pass per detector)", { ...DEFAULT_RUN_RULE_OPTIONS, nelsonSameSideRun: 8.5, beyondOneSigma: { count: 4, window: 5.5 } }],
];

describe("evaluateRunRules in one pass equals the per-detector definitions", () => {
  it.each(optionSets)("%s", (_, options) => {
    for (const seed of [3, 17, 2024, 99991]) {
      const values = seededValues(seed, 1500);
      const firings = evaluateRunRules(values, limits, RULE_IDS, options);
      for (const rule of RULE_IDS) expect(Array.from(firings.get(rule)!), `${rule}, seed ${seed}`).toEqual(Array.from(reference(rule, values, options)));
    }
  });
  it("rules sharing a detector get arrays of their own; short and empty series", () => {
    const firings = evaluateRunRules([0, 3.5, -4], limits, ["we-1", "nelson-1"]);
    expect(firings.get("we-1")).not.toBe(firings.get("nelson-1"));
    expect(Array.from(firings.get("nelson-1")!)).toEqual([0, 1, -1]);
    expect(evaluateRunRules([], limits, RULE_IDS).get("nelson-4")!.length).toBe(0);
  });
});
