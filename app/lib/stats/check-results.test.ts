import { describe, expect, it } from "vitest";
import { eccentricity } from "./eccentricity";
import { isFitForNetWeight, minimumWeight, repeatability } from "./repeatability";
import { classifyResult, judgeResult, toleranceLimit } from "./requirement";
import { sensitivityError } from "./sensitivity";

// USP General Chapter <41> Balances (S; worked values C): REFERENCE.md §3.
describe("repeatability and minimum weight (USP <41>)", () => {
  it("published example: s = 0.00015 g → m_min = 2000·s = 0.30000 g", () => {
    expect(minimumWeight(0.00015)).toBeCloseTo(0.3, 12);
  });
  it.each([
    { d: 0.0001, lowest: 0.082 },
    { d: 0.00001, lowest: 0.0082 },
  ])("0.41·d floor: d = $d g → lowest m_min = 820·d = $lowest g", ({ d, lowest }) => {
    const result = repeatability(Array(10).fill(20.0001), d); // readings that never change: s = 0
    expect(result.s).toBe(0);
    expect(result.floored).toBe(true);
    expect(result.minimumWeight).toBeCloseTo(lowest, 12);
  });
  it("ten readings of a 20 g weight: s (n − 1) and m_min", () => {
    const readings = [20.0001, 20.0003, 20.0002, 20.0002, 20.0001, 20.0003, 20.0002, 20.0001, 20.0002, 20.0003];
    const result = repeatability(readings, 0.0001);
    expect(result.s).toBeCloseTo(Math.sqrt(6 / 9) * 1e-4, 12); // deviations ±1, 0 in units of d: Σ = 6, n − 1 = 9
    expect(result.floored).toBe(false);
    expect(result.minimumWeight).toBeCloseTo(2000 * result.s, 12);
  });
  it("one reading: s and m_min are NaN", () => {
    expect(repeatability([5], 0.001).minimumWeight).toBeNaN();
  });
  it.each([
    { net: 0.6, fit: true },
    { net: 0.59, fit: false },
  ])("safety factor 2 (common practice): m_min 0.3 g fits $net g → $fit", ({ net, fit }) => {
    expect(isFitForNetWeight(net, 0.3)).toBe(fit);
  });
});

describe("sensitivity (USP <41> accuracy) and requirement", () => {
  it("100 g weight: T = 0.10 % → pass for 99.9000 g ≤ I ≤ 100.1000 g", () => {
    expect(toleranceLimit({ kind: "usp-41" }, 100)).toBeCloseTo(0.1, 12);
    const noGuard = { kind: "uncertainty", expandedUncertainty: 0 } as const;
    for (const [indication, outcome] of [[99.9, "in_tolerance"], [100.1, "in_tolerance"], [100.1001, "out_of_tolerance"], [99.8999, "out_of_tolerance"]] as const) {
      const { error } = sensitivityError(indication, 100);
      expect(judgeResult(error, 100, { kind: "absolute", grams: 0.1 }, noGuard).outcome).toBe(outcome);
    }
  });
  it("e = E/m_ref; e is NaN for m_ref = 0", () => {
    expect(sensitivityError(100.0004, 100).relativeError).toBeCloseTo(4e-6, 12);
    expect(sensitivityError(1, 0).relativeError).toBeNaN();
  });
  it.each([
    { result: 0.0666, outcome: "in_tolerance" },
    { result: -0.0667, outcome: "guard_band" },
    { result: 0.1, outcome: "guard_band" },
    { result: 0.1001, outcome: "out_of_tolerance" },
  ])("T = 0.1 g, G = T/3 (default): |r| = $result → $outcome (boundaries inclusive)", ({ result, outcome }) => {
    expect(judgeResult(result, 100, { kind: "absolute", grams: 0.1 }).outcome).toBe(outcome);
  });
  it("guard band from the expanded uncertainty, and one wider than T leaves no acceptance", () => {
    const judged = judgeResult(0.05, 100, { kind: "percent-of-load", percent: 0.1 }, { kind: "uncertainty", expandedUncertainty: 0.04 });
    expect(judged.acceptance).toBeCloseTo(0.06, 12);
    expect(judged.outcome).toBe("in_tolerance");
    expect(judgeResult(0, 1, { kind: "absolute", grams: 0.1 }, { kind: "uncertainty", expandedUncertainty: 0.2 }).acceptance).toBe(0);
    expect(classifyResult(Number.NaN, 1, 0.5)).toBe("out_of_tolerance");
  });
  it("R 76 in-service tolerance: class III, e = 1 g, 1500 g → 2 g (REFERENCE.md §2)", () => {
    expect(toleranceLimit({ kind: "oiml-r76-in-service", accuracyClass: "III", e: 1 }, 1500)).toBe(2);
  });
});

describe("eccentricity (EURAMET cg-18: ΔI = I_pos − I_centre, M)", () => {
  it("largest |ΔI| and where", () => {
    const result = eccentricity({ centre: 200.0001, frontLeft: 200.0003, backLeft: 199.9998, backRight: 200.0001, frontRight: 200.0002 });
    expect(result.maxAbsDeviation).toBeCloseTo(0.0003, 12);
    expect(result.worstPosition).toBe("backLeft");
    expect(result.deviations.frontLeft).toBeCloseTo(0.0002, 12);
  });
  it("ties keep the first position; all equal gives 0", () => {
    expect(eccentricity({ centre: 1, frontLeft: 1.1, backLeft: 0.9, backRight: 1, frontRight: 1 }).worstPosition).toBe("frontLeft");
    expect(eccentricity({ centre: 1, frontLeft: 1, backLeft: 1, backRight: 1, frontRight: 1 }).maxAbsDeviation).toBe(0);
  });
});
