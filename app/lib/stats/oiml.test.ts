import { describe, expect, it } from "vitest";
import { classConsistencyWarning, eccentricityTestLoad, initialVerificationMpe, inServiceMpe } from "./oiml-r76";
import { WEIGHT_CLASSES, WEIGHT_NOMINALS_G, weightClassMpeMg } from "./oiml-r111";
import { describeWithSharedData, readCsv } from "./shared-data.testing";
import { R111_SPOT_VALUES } from "./r111-spot-values.testing";

// OIML R 111-1:2004 Table 1 (S, two transcriptions agree): REFERENCE.md §1.
describe("OIML R 111 class mpe look-ups (spot values, REFERENCE.md §1)", () => {
  it.each(R111_SPOT_VALUES)("%s %f g → %f mg", (weightClass, grams, mg) => {
    expect(weightClassMpeMg(weightClass, grams)).toBe(mg);
  });
  it("not listed: a 3 g nominal, or M3 below 1 g", () => {
    expect(weightClassMpeMg("F1", 3)).toBeNull();
    expect(weightClassMpeMg("M3", 0.5)).toBeNull();
  });
  it("pattern E1:E2:F1:F2:M1:M2:M3 ≈ 1:3:10:30:100:300:1000 from 1 g up (within a factor 1.7)", () => {
    for (const nominal of WEIGHT_NOMINALS_G.filter((g) => g >= 1)) {
      const e1 = weightClassMpeMg("E1", nominal)!;
      [1, 3, 10, 30, 100, 300, 1000].forEach((ratio, i) => {
        const value = weightClassMpeMg(WEIGHT_CLASSES[i], nominal)!;
        expect(value / (ratio * e1)).toBeGreaterThan(1 / 1.7);
        expect(value / (ratio * e1)).toBeLessThan(1.7);
      });
    }
  });
});

describeWithSharedData("OIML R 111 table typed in the engine equals OIML_R111-1_2004_Table1_mpe_mg.csv cell by cell", () => {
  it.each(readCsv("OIML_R111-1_2004_Table1_mpe_mg.csv").map((row) => [row.nominal, row] as const))("%s", (_name, row) => {
    for (const weightClass of WEIGHT_CLASSES) {
      const cell = row[weightClass];
      expect(weightClassMpeMg(weightClass, Number(row.nominal_g))).toBe(cell === "" ? null : Number(cell));
    }
  });
});

// OIML R 76-1:2006 Table 6 (S) and in-service rule (P): REFERENCE.md §2.
describe("OIML R 76 mpe", () => {
  it.each([
    { load: 400, initial: 0.5, inService: 1 },
    { load: 1500, initial: 1, inService: 2 },
    { load: 6000, initial: 1.5, inService: 3 },
    { load: 500, initial: 0.5, inService: 1 },
    { load: 501, initial: 1, inService: 2 },
    { load: 2000, initial: 1, inService: 2 },
  ])("worked case class III, e = 1 g, Max 6 kg: $load g → $initial g initial, $inService g in service", ({ load, initial, inService }) => {
    expect(initialVerificationMpe("III", 1, load)).toBe(initial);
    expect(inServiceMpe("III", 1, load)).toBe(inService);
  });
  it.each([
    ["I", 0.001, 50, 0.0005], ["I", 0.001, 60, 0.001], ["II", 0.001, 5, 0.0005], ["II", 0.001, 5.001, 0.001], ["II", 0.01, 220, 0.015], ["IIII", 5, 1100, 7.5],
  ] as const)("class %s, e = %f g, load %f g → initial mpe %f g", (accuracyClass, e, load, mpe) => {
    expect(initialVerificationMpe(accuracyClass, e, load)).toBeCloseTo(mpe, 12);
  });
  it("eccentricity test load Max/3 for up to four supports, Max/(n − 1) above", () => {
    expect(eccentricityTestLoad(300)).toBe(100);
    expect(eccentricityTestLoad(600, 6)).toBe(120);
  });
});

describe("OIML R 76 class consistency (Table 3)", () => {
  it.each([
    { cls: "II", e: 0.01, max: 220, warns: null },
    { cls: "I", e: 0.001, max: 220, warns: null },
    { cls: "III", e: 1, max: 6000, warns: null },
    { cls: "I", e: 0.001, max: 20, warns: /below the 50\u2009000/ },
    { cls: "II", e: 0.1, max: 300, warns: /Max\/e = 3\u2009000 is below the 5\u2009000/ },
    { cls: "III", e: 0.05, max: 10, warns: /allows e = 0.1 g to 2 g or at least 5 g for class III/ },
    { cls: "IIII", e: 5, max: 10000, warns: /above the 1\u2009000/ },
    { cls: "II", e: 0, max: 10, warns: null },
  ] as const)("class $cls, e = $e g, Max = $max g", ({ cls, e, max, warns }) => {
    const warning = classConsistencyWarning(cls, e, max);
    if (warns === null) expect(warning).toBeNull();
    else expect(warning).toMatch(warns);
  });
});
