import { describe, expect, it } from "vitest";
import { reviewInterval, type IntervalReviewInput } from "./interval-review";

// ILAC-G24 / OIML D 10 methods 1 (staircase, "within e.g. 80 % of the mpe", S) and 2 (control chart, M);
// 5 consecutive in-tolerance checks before extending is our default (common practice).
const good = Array(6).fill("in_tolerance") as IntervalReviewInput["outcomes"];
const base: IntervalReviewInput = { outcomes: good, utilisation: Array(6).fill(0.3), signalCount: 0, daysToTolerance: null, intervalDays: 30 };

describe("reviewInterval", () => {
  it.each([
    { name: "six good checks, no signal, no forecast", input: base, recommendation: "extend", says: /last 6 checks/ },
    { name: "latest out of tolerance", input: { ...base, outcomes: [...good, "out_of_tolerance"] }, recommendation: "shorten", says: /out of tolerance/ },
    { name: "forecast within the interval", input: { ...base, daysToTolerance: 20 }, recommendation: "shorten", says: /in 20 days, within the current interval of 30 days/ },
    { name: "forecast within two intervals", input: { ...base, daysToTolerance: 45 }, recommendation: "keep", says: /within two intervals/ },
    { name: "a statistical signal", input: { ...base, signalCount: 1 }, recommendation: "keep", says: /1 statistical signal since/ },
    { name: "too few good checks", input: { ...base, outcomes: good.slice(0, 4) }, recommendation: "keep", says: /only 4 of the 5/ },
    { name: "latest in the guard band", input: { ...base, outcomes: [...good, "guard_band"] }, recommendation: "keep", says: /latest check was not within acceptance/ },
    { name: "a result above 80 % of T", input: { ...base, utilisation: [0.3, 0.3, 0.3, 0.3, 0.3, 0.85] }, recommendation: "keep", says: /more than 80 %/ },
    { name: "no checks", input: { ...base, outcomes: [] }, recommendation: "keep", says: /No checks/ },
  ] as const)("$name → $recommendation", ({ input, recommendation, says }) => {
    const review = reviewInterval(input as IntervalReviewInput);
    expect(review.recommendation).toBe(recommendation);
    expect(review.reason).toMatch(says);
    expect(review.reason).toMatch(/quality system/);
  });
});
