import { describe, expect, it } from "vitest";
import { c4Factor, controlChartConstants, D2_INDIVIDUALS, rangeMeanFactor, shewhartArl } from "./control-constants";
import { describeWithSharedData, readCsv } from "./shared-data.testing";

const FACTORS = ["d2", "d3", "c4", "A2", "A3", "B3", "B4", "D3", "D4"] as const;

// Montgomery, Introduction to SQC, App. VI (S) with exact columns (C) in control_chart_constants_n2-10.csv.
describeWithSharedData("control chart constants n = 2…10 vs control_chart_constants_n2-10.csv", () => {
  const rows = readCsv("control_chart_constants_n2-10.csv");
  it.each(rows.map((row) => [Number(row.n), row] as const))("n = %i: computed factors match the exact column to 4 decimals and the published one to 1 unit of its last digit", (n, row) => {
    const computed = controlChartConstants(n);
    for (const factor of FACTORS) {
      expect(computed[factor]).toBeCloseTo(Number(row[`${factor}_exact`]), 4);
      const published = row[factor];
      const decimals = published.split(".")[1]?.length ?? 0;
      // The printed table derives D4 etc. from rounded d2, d3 (D4(3) = 2.574, exact 2.5746), so allow one unit.
      expect(Math.abs(computed[factor] - Number(published))).toBeLessThanOrEqual(10 ** -decimals + 1e-12);
    }
  });
});

describe("individuals chart constant", () => {
  it("d2(2) = 2/√π = 1.12838 by integration; the published 1.128 is what the limits use (DESIGN §3)", () => {
    expect(rangeMeanFactor(2)).toBeCloseTo(2 / Math.sqrt(Math.PI), 8);
    expect(D2_INDIVIDUALS).toBe(1.128);
    expect(3 / D2_INDIVIDUALS).toBeCloseTo(2.66, 2); // E2 = 2.660, REFERENCE.md §5
  });
  it.each([1, 0, 2.5])("n = %s is not a subgroup size: NaN", (n) => {
    expect(rangeMeanFactor(n)).toBeNaN();
    expect(c4Factor(n)).toBeNaN();
  });
});

// REFERENCE.md §5, computed from the normal tail (C).
describe("Shewhart 3σ ARL", () => {
  it.each([
    { shift: 0, arl: 370.4, decimals: 1 },
    { shift: 0.5, arl: 155.2, decimals: 1 },
    { shift: 1, arl: 43.89, decimals: 2 },
    { shift: 1.5, arl: 14.97, decimals: 2 },
    { shift: 2, arl: 6.3, decimals: 2 },
    { shift: 3, arl: 2.0, decimals: 2 },
  ])("shift $shift σ → ARL $arl", ({ shift, arl, decimals }) => {
    expect(Math.abs(shewhartArl(shift) - arl)).toBeLessThanOrEqual(0.5 * 10 ** -decimals);
  });
});
