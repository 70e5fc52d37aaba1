import { describe, expect, it } from "vitest";
import { controlLimits } from "./limits";
import { describeRule, episodeStarts } from "./rule-messages";
import { DEFAULT_RUN_RULE_OPTIONS, evaluateRunRules, isRuleId, resolveRules, RULE_SETS, type RuleId } from "./run-rules";

// Definitions: DESIGN.md §3 (to the letter) after Nelson (1984) and the Western Electric handbook (1956), REFERENCE.md §5.
// Centre 0, σ̂ = 1, so zone edges are ±1, ±2, ±3 and values read directly in σ.
const limits = controlLimits({ center: 0, sigma: 1 });

function firingIndexes(rule: RuleId, values: number[], options = DEFAULT_RUN_RULE_OPTIONS): [number, number][] {
  const firing = evaluateRunRules(values, limits, [rule], options).get(rule)!;
  return Array.from(firing).flatMap((direction, index) => (direction === 0 ? [] : [[index, direction] as [number, number]]));
}

const times = (count: number, value: number) => Array<number>(count).fill(value);
const alternatingWithin = (count: number) => Array.from({ length: count }, (_, i) => (i % 2 ? -0.5 : 0.5));
const zigzag = (count: number) => Array.from({ length: count }, (_, i) => (i % 2 ? 0.2 : -0.2));

interface Case {
  rules: RuleId[];
  name: string;
  values: number[];
  /** [index, direction]: 1 above/rising, −1 below/falling, 2 no side. */
  fires: [number, number][];
}

const cases: Case[] = [
  { rules: ["nelson-1", "we-1"], name: "beyond ±3σ fires on each such point", values: [0, 3.1, 0, -3.5], fires: [[1, 1], [3, -1]] },
  { rules: ["nelson-1", "we-1"], name: "near miss: exactly on the limit and just inside", values: [3, -3, 2.99], fires: [] },
  { rules: ["nelson-2"], name: "9 in a row above fires at the 9th and each later point of the run", values: times(10, 0.5), fires: [[8, 1], [9, 1]] },
  { rules: ["nelson-2"], name: "9 in a row below", values: [1, ...times(9, -0.2)], fires: [[9, -1]] },
  { rules: ["nelson-2"], name: "near miss: 8 in a row (one short)", values: times(8, 0.5), fires: [] },
  { rules: ["nelson-2"], name: "near miss: a point on the centre line breaks the run", values: [...times(4, 0.5), 0, ...times(5, 0.5)], fires: [] },
  { rules: ["nelson-2"], name: "near miss: opposite sides", values: [...times(4, 0.5), ...times(5, -0.5)], fires: [] },
  { rules: ["we-4"], name: "8 in a row below fires at the 8th", values: times(8, -0.5), fires: [[7, -1]] },
  { rules: ["we-4"], name: "near miss: 7 in a row", values: times(7, -0.5), fires: [] },
  { rules: ["we-4"], name: "near miss: centre line point in the run", values: [...times(3, -0.5), 0, ...times(4, -0.5)], fires: [] },
  { rules: ["nelson-3"], name: "6 rising points fire at the 6th and later", values: [-1, -0.6, -0.2, 0.2, 0.6, 1, 1.4], fires: [[5, 1], [6, 1]] },
  { rules: ["nelson-3"], name: "6 falling points", values: [1, 0.6, 0.2, -0.2, -0.6, -1], fires: [[5, -1]] },
  { rules: ["nelson-3"], name: "near miss: 5 rising points", values: [-1, -0.5, 0, 0.5, 1], fires: [] },
  { rules: ["nelson-3"], name: "near miss: a tie breaks the rise", values: [-1, -0.5, 0, 0, 0.5, 1, 1.5], fires: [] },
  { rules: ["nelson-4"], name: "14 alternating points fire at the 14th", values: zigzag(14), fires: [[13, 2]] },
  { rules: ["nelson-4"], name: "near miss: 13 alternating points", values: zigzag(13), fires: [] },
  { rules: ["nelson-4"], name: "near miss: a tie (zero difference) inside", values: [...zigzag(7), -0.2, ...zigzag(6).map((x) => -x)], fires: [] },
  { rules: ["nelson-4"], name: "near miss: two rises in a row", values: [...zigzag(7), 0.1, 0.4, ...zigzag(5)], fires: [] },
  { rules: ["nelson-5", "we-2"], name: "2 of 3 beyond 2σ above, the last one beyond", values: [2.5, 0, 2.5], fires: [[2, 1]] },
  { rules: ["nelson-5", "we-2"], name: "2 of 3 below; the window must be complete", values: [-2.5, -2.5, 0, -2.1], fires: [[3, -1]] },
  { rules: ["nelson-5", "we-2"], name: "near miss: the point itself is not beyond 2σ", values: [0, 2.5, 2.5, 1], fires: [[2, 1]] },
  { rules: ["nelson-5", "we-2"], name: "near miss: opposite sides", values: [0, 2.5, -2.5], fires: [] },
  { rules: ["nelson-5", "we-2"], name: "near miss: exactly 2σ is not beyond", values: [0, 2, 2.5], fires: [] },
  { rules: ["nelson-6", "we-3"], name: "4 of 5 beyond 1σ above", values: [1.5, 1.5, 0, 1.5, 1.5], fires: [[4, 1]] },
  { rules: ["nelson-6", "we-3"], name: "4 of 5 below, beyond 3σ counts as beyond 1σ", values: [-1.5, -3.5, -1.2, 0.5, -2.2], fires: [[4, -1]] },
  { rules: ["nelson-6", "we-3"], name: "near miss: opposite sides", values: [1.5, 1.5, 0, 1.5, -1.5], fires: [] },
  { rules: ["nelson-6", "we-3"], name: "near miss: exactly 1σ", values: [1.5, 1.5, 0, 1.5, 1], fires: [] },
  { rules: ["nelson-6", "we-3"], name: "near miss: only 3 of 5", values: [1.5, 0, 0, 1.5, 1.5], fires: [] },
  { rules: ["nelson-7"], name: "15 within 1σ (centre line included) fire at the 15th", values: [0, ...alternatingWithin(14)], fires: [[14, 2]] },
  { rules: ["nelson-7"], name: "near miss: 14 within 1σ", values: alternatingWithin(14), fires: [] },
  { rules: ["nelson-7"], name: "near miss: a point exactly at 1σ breaks the run", values: [...alternatingWithin(7), 1, ...alternatingWithin(7)], fires: [] },
  { rules: ["nelson-8"], name: "8 beyond 1σ on both sides fire at the 8th", values: [1.5, -1.5, 2.5, -2.5, 1.2, -1.2, 1.5, -1.5], fires: [[7, 2]] },
  { rules: ["nelson-8"], name: "near miss: all on one side", values: times(8, 1.5), fires: [] },
  { rules: ["nelson-8"], name: "near miss: 7 points", values: [1.5, -1.5, 2.5, -2.5, 1.2, -1.2, 1.5], fires: [] },
  { rules: ["nelson-8"], name: "near miss: one exactly at 1σ", values: [1.5, -1.5, 2.5, -1, 1.2, -1.2, 1.5, -1.5], fires: [] },
];

describe("run rules fire exactly where DESIGN §3 says", () => {
  it.each(cases.flatMap((c) => c.rules.map((rule) => ({ ...c, rule }))))("$rule: $name", ({ rule, values, fires }) => {
    expect(firingIndexes(rule, values)).toEqual(fires);
  });
});

describe("run lengths are parameters", () => {
  it("nelson-2 with a run of 7 (a length some sources use) fires at the 7th point", () => {
    expect(firingIndexes("nelson-2", times(7, 0.5), { ...DEFAULT_RUN_RULE_OPTIONS, nelsonSameSideRun: 7 })).toEqual([[6, 1]]);
  });
  it("defaults: 9, 8, 6, 14, 2 of 3, 4 of 5, 15, 8", () => {
    expect(DEFAULT_RUN_RULE_OPTIONS).toEqual({
      nelsonSameSideRun: 9, westernElectricSameSideRun: 8, trendRun: 6, alternatingRun: 14,
      beyondTwoSigma: { count: 2, window: 3 }, beyondOneSigma: { count: 4, window: 5 }, withinOneSigmaRun: 15, bothSidesRun: 8,
    });
  });
});

describe("rule sets, ids, messages and episodes", () => {
  it("sets", () => {
    expect(resolveRules()).toEqual(RULE_SETS.nelson);
    expect(resolveRules("western-electric")).toEqual(["we-1", "we-2", "we-3", "we-4"]);
    expect(resolveRules("none")).toEqual([]);
    expect(resolveRules(["we-1", "nelson-7", "we-1"])).toEqual(["we-1", "nelson-7"]);
  });
  it.each([["nelson-8", true], ["we-5", false], ["Nelson-1", false]] as const)("isRuleId(%s) = %s", (id, ok) => expect(isRuleId(id)).toBe(ok));
  it.each([
    ["nelson-2", 1, "9 points in a row above the centre line"],
    ["we-4", -1, "8 points in a row below the centre line"],
    ["nelson-3", -1, "6 points in a row steadily decreasing"],
    ["nelson-5", 1, "2 of 3 points in a row beyond 2σ above the centre line"],
    ["nelson-8", 2, "8 points in a row beyond 1σ, on both sides of the centre line"],
  ] as const)("%s (%i): %s", (rule, direction, message) => expect(describeRule(rule, direction)).toBe(message));
  it("episodes start at the first point of each run of firing points", () => {
    expect(episodeStarts(Int8Array.from([0, 1, 1, 0, -1, 0, 0, 2]))).toEqual([1, 4, 7]);
    expect(episodeStarts(new Int8Array(0))).toEqual([]);
  });
});
