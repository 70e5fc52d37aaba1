import { describe, expect, it } from "vitest";
import { assessRisk, type RiskInput } from "./risk";

// An analytical balance, d = 0.1 mg, e = 1 mg, class I (the demo's AVP-AB kind).
const analytical: RiskInput = {
  consequence: "patient_safety",
  smallestNetWeightG: 0.5,
  processTolerancePercent: 0.1,
  readabilityG: 0.0001,
  verificationIntervalG: 0.001,
  accuracyClass: "I",
  measuredMinimumWeightG: null,
  safetyFactor: 2,
};

describe("risk assessment of a check plan", () => {
  it("patient safety on a tight process is high risk: daily sensitivity, weekly repeatability, monthly eccentricity", () => {
    const risk = assessRisk(analytical);
    // USP <41> floor 820 d = 82 mg (REFERENCE.md §3, C); 0.5 g / (2 × 82 mg) = 3.05 → moderate; 0.1 % of 0.5 g = 0.5 mg vs in-service mpe 1 mg → tight.
    expect(risk.tightnessScore).toBe(3);
    expect(risk).toMatchObject({ consequenceScore: 3, score: 9, band: "high", unfit: false });
    expect(risk.suggestedIntervals).toEqual({ sensitivity: 1, repeatability: 7, eccentricity: 30 });
    expect(risk.reasoning.join(" ")).toMatch(/82 mg/);
  });

  it("internal use with ample margins is low risk and drops the eccentricity check", () => {
    const risk = assessRisk({ ...analytical, consequence: "internal_use", smallestNetWeightG: 50, processTolerancePercent: 1 });
    expect(risk).toMatchObject({ band: "low", score: 1 });
    expect(risk.suggestedIntervals).toEqual({ sensitivity: 30, repeatability: 90 });
  });

  it("uses the measured minimum weight once there is one, and says the instrument is unfit below SF × m_min", () => {
    // USP <41> example (REFERENCE.md §3, S): s = 0.15 mg → m_min = 0.3 g; 0.5 g < 2 × 0.3 g.
    const risk = assessRisk({ ...analytical, consequence: "product_release", measuredMinimumWeightG: 0.3 });
    expect(risk.unfit).toBe(true);
    expect(risk.band).toBe("high");
    expect(risk.reasoning.join(" ")).toMatch(/cannot weigh it to 0.10 %/);
  });

  it("treats a missing smallest net weight as tight rather than guessing it is fine", () => {
    expect(assessRisk({ ...analytical, consequence: "product_release", smallestNetWeightG: null, processTolerancePercent: null })).toMatchObject({ tightnessScore: 3, band: "high" });
  });
});
