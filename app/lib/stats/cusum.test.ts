import { describe, expect, it } from "vitest";
import { tabularCusum } from "./cusum";
import { describeWithSharedData, readCsv } from "./shared-data.testing";

// Montgomery, Introduction to SQC, Example 9.1 / Table 9.1 (S; all 29 published C⁺ reproduced C): REFERENCE.md §6.
describeWithSharedData("tabular CUSUM: Montgomery Table 9.1 (μ₀ = 10, σ = 1, K = 0.5, H = 5)", () => {
  const rows = readCsv("Montgomery_Table9-1_CUSUM.csv");
  const result = tabularCusum(rows.map((row) => Number(row.x)), 10, 1, { k: 0.5, h: 5 });
  const published = rows.filter((row) => row.C_plus_published !== "");
  it("the table has 29 published C⁺ values", () => expect(published).toHaveLength(29));
  it.each(published.map((row) => [Number(row.i), Number(row.C_plus_published)] as const))("period %i: C⁺ = %f (2 dp)", (period, cPlus) => {
    expect(Math.abs(result.high[period - 1] - cPlus)).toBeLessThanOrEqual(0.005 + 1e-9);
  });
  it("first signal at period 29 (C⁺ = 5.28 > H), after 7 consecutive non-zero sums (shift after period 22)", () => {
    expect(Array.from(result.signalHigh).indexOf(1) + 1).toBe(29);
    let run = 0;
    for (let i = 28; i >= 0 && result.high[i] > 0; i--) run++;
    expect(run).toBe(7);
    expect(10 + 0.5 + result.high[28] / run).toBeCloseTo(11.25, 2); // new mean estimate
  });
  it("C⁻ never exceeds H; no reset after the signal (period 30 stays above H)", () => {
    expect(Array.from(result.signalLow).every((s) => s === 0)).toBe(true);
    expect(result.high[29]).toBeCloseTo(5.3, 2);
    expect(result.signalHigh[29]).toBe(1);
  });
});

describe("tabularCusum edge cases", () => {
  it("a value exactly at centre + kσ adds nothing; strict > hσ for a signal", () => {
    const result = tabularCusum([10.5, 15.5], 10, 1, { k: 0.5, h: 5 });
    expect(Array.from(result.high)).toEqual([0, 5]);
    expect(Array.from(result.signalHigh)).toEqual([0, 0]);
  });
  it("empty input gives empty arrays", () => expect(tabularCusum([], 0, 1).high.length).toBe(0));
});
