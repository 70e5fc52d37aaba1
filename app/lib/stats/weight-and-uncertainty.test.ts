import { describe, expect, it } from "vitest";
import { eccentricityUncertainty, indicationUncertainty, roundingUncertainty } from "./uncertainty";
import { assessWeightSuitability } from "./weight-suitability";

// USP <41>: weight mpe or certificate U ≤ one third of the test limit (S); REFERENCE.md §3: 100 g → 33.3 mg.
describe("test-weight suitability", () => {
  const check = "2025-03-10";
  it("one-third rule: T = 0.1 g → limit 33.3 mg", () => {
    expect(assessWeightSuitability({ nominalGrams: 100, weightClass: "F2", certificateDueDate: "2026-01-01" }, 0.1, check).limit * 1000).toBeCloseTo(33.3, 1);
  });
  it.each([
    { name: "F2 100 g (1.6 mg) for T = 0.1 g", weight: { nominalGrams: 100, weightClass: "F2", certificateDueDate: "2026-01-01" }, tolerance: 0.1, suitable: true, says: null },
    { name: "M1 1 kg (50 mg) for T = 0.1 g", weight: { nominalGrams: 1000, weightClass: "M1", certificateDueDate: "2026-01-01" }, tolerance: 0.1, suitable: false, says: /class mpe \(50 mg\) is more than one third/ },
    { name: "certificate U 40 mg for T = 0.1 g", weight: { nominalGrams: 100, expandedUncertainty: 0.04, certificateDueDate: "2026-01-01" }, tolerance: 0.1, suitable: false, says: /uncertainty \(40 mg\)/ },
    { name: "certificate ran out before the check", weight: { nominalGrams: 100, weightClass: "F1", certificateDueDate: "2025-03-09" }, tolerance: 0.1, suitable: false, says: /due on 2025-03-09, before the check date 2025-03-10/ },
    { name: "due on the check date is still current", weight: { nominalGrams: 100, weightClass: "F1", certificateDueDate: "2025-03-10" }, tolerance: 0.1, suitable: true, says: null },
    { name: "nothing recorded", weight: { nominalGrams: 100 }, tolerance: 0.1, suitable: false, says: /Neither a weight class nor/ },
  ] as const)("$name → suitable: $suitable", ({ weight, tolerance, suitable, says }) => {
    const result = assessWeightSuitability(weight, tolerance, check);
    expect(result.suitable).toBe(suitable);
    if (says) expect(result.problems.join(" ")).toMatch(says);
  });
});

// EURAMET cg-18 v4.0 style budget (M; worked values C): REFERENCE.md §4.
describe("uncertainty of an indication", () => {
  it("rounding d/√12: d = 0.1 mg → 0.02887 mg per reading, 0.04082 mg for zero + load", () => {
    expect(roundingUncertainty(0.1)).toBeCloseTo(0.02887, 5);
    expect(Math.hypot(roundingUncertainty(0.1), roundingUncertainty(0.1))).toBeCloseTo(0.04082, 5);
  });
  it("eccentricity |ΔI|max·I/(2·L·√3): 0.3 mg at L = 100 g, reading 200 g → 0.1732 mg", () => {
    expect(eccentricityUncertainty(0.3, 100, 200)).toBeCloseTo(0.1732, 4);
  });
  it("budget in grams: combined is the root sum of squares, U = 2u; class-only weight uses mpe/√3", () => {
    const budget = indicationUncertainty({
      readability: 0.0001, indication: 200, repeatabilitySd: 0.00008,
      eccentricity: { maxAbsDeviation: 0.0003, load: 100 }, testWeight: { classMpe: 0.0003 },
    });
    expect(budget.testWeight).toBeCloseTo(0.0003 / Math.sqrt(3), 12);
    const expected = Math.sqrt(2 * (0.0001 ** 2 / 12) + 0.00008 ** 2 + (0.0003 * 200 / (200 * Math.sqrt(3))) ** 2 + 0.0003 ** 2 / 3);
    expect(budget.combined).toBeCloseTo(expected, 12);
    expect(budget.expanded).toBeCloseTo(2 * expected, 12);
  });
  it("a certificate weight contributes U/2; missing parts contribute 0", () => {
    const budget = indicationUncertainty({ readability: 0.001, indication: 50, testWeight: { expandedUncertainty: 0.0002 } });
    expect(budget.testWeight).toBeCloseTo(0.0001, 12);
    expect([budget.repeatability, budget.eccentricity]).toEqual([0, 0]);
  });
});
