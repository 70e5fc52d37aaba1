import { describe, expect, it } from "vitest";
import { ACCURACY_CLASSES, classConsistencyWarning } from "./stats/oiml-r76";

const fittingClasses = (e: number, max: number) => ACCURACY_CLASSES.filter((c) => classConsistencyWarning(c, e, max) === null);
import { InstrumentFormSchema, instrumentValues } from "./instrument-form";

const base = {
  assetTag: "AVP-AB-01",
  siteId: "1",
  kind: "analytical_balance",
  unit: "g",
  capacity: "220",
  readability: "0.0001",
  verificationInterval: "0.001",
  accuracyClass: "I",
  riskLevel: "high",
};

describe("OIML R 76-1:2006 Table 3 class bands (REFERENCE.md §2, S: scan of the table)", () => {
  // Each row: class, e (g), Max (g), fits?
  const cases: [string, number, number, boolean][] = [
    ["I", 0.001, 220, true], // n = 220 000 ≥ 50 000
    ["I", 0.001, 40, false], // n = 40 000 < 50 000
    ["II", 0.01, 6200, false], // 0.001 ≤ e ≤ 0.05 g allows n up to 100 000; n = 620 000
    ["II", 0.01, 620, true], // n = 62 000 within 100–100 000
    ["II", 0.1, 400, false], // e ≥ 0.1 g needs n ≥ 5 000; n = 4 000
    ["II", 0.1, 600, true], // n = 6 000
    ["III", 1, 6000, true], // 0.1 ≤ e ≤ 2 g, n = 6 000 ≤ 10 000 (the R 76 class III worked case, Max 6 kg, e 1 g)
    ["III", 5, 1500, false], // e ≥ 5 g needs n ≥ 500; n = 300
    ["III", 5, 3000, true], // n = 600
    ["IIII", 5, 6000, false], // n = 1 200 > 1 000
    ["IIII", 10, 5000, true], // n = 500
    ["IIII", 1, 500, false], // class IIII needs e ≥ 5 g
  ];
  it.each(cases)("class %s, e = %s g, Max = %s g → fits %s", (cls, e, max, fits) => {
    expect(classConsistencyWarning(cls as "I", e, max) === null).toBe(fits);
  });

  it("names the band it violated", () => {
    expect(classConsistencyWarning("I", 0.001, 40)).toMatch(/below the 50\u2009000 that OIML R 76 requires for class I/);
    expect(classConsistencyWarning("IIII", 1, 500)).toMatch(/at least 5 g for class IIII/);
  });

  it("a 6 kg scale with e = 1 g (n = 6 000) fits class II (e ≥ 0.1 g, n ≥ 5 000) and class III", () => {
    expect(fittingClasses(1, 6000)).toEqual(["II", "III"]);
  });
});

describe("instrument form", () => {
  it("accepts a consistent analytical balance and converts to grams exactly", () => {
    const result = InstrumentFormSchema.safeParse(base);
    expect(result.success).toBe(true);
    if (result.success) expect(instrumentValues(result.data)).toMatchObject({ capacityG: "220", readabilityG: "0.0001", accuracyClass: "I" });
  });

  it("converts mg and kg by moving the decimal point, never through floats", () => {
    const mg = InstrumentFormSchema.parse({ ...base, unit: "mg", capacity: "6100", readability: "0.001", verificationInterval: "1", accuracyClass: "II" });
    expect(instrumentValues(mg)).toMatchObject({ capacityG: "6.1", readabilityG: "0.000001", verificationIntervalG: "0.001" });
    const kg = InstrumentFormSchema.parse({ ...base, kind: "floor_scale", unit: "kg", capacity: "600", readability: "0.1", verificationInterval: "0.1", accuracyClass: "III" });
    expect(instrumentValues(kg)).toMatchObject({ capacityG: "600000", readabilityG: "100" });
  });

  it.each([
    [{ readability: "0.01", verificationInterval: "0.001" }, "readability", /d must not exceed e/],
    [{ verificationInterval: "300" }, "verificationInterval", /e must not exceed Max/],
    [{ capacity: "abc" }, "capacity", /must be a number/],
    [{ capacity: "-5" }, "capacity", /greater than zero/],
    [{ accuracyClass: "I", capacity: "40" }, "accuracyClass", /below the 50\u2009000 that OIML R 76 requires/],
    [{ smallestNetWeight: "500" }, "smallestNetWeight", /cannot exceed Max/],
    [{ assetTag: "has space" }, "assetTag", /letters, digits/],
  ])("refuses %o on %s", (patch, field, message) => {
    const result = InstrumentFormSchema.safeParse({ ...base, ...patch });
    expect(result.success).toBe(false);
    const issue = result.error?.issues.find((i) => i.path[0] === field);
    expect(issue?.message).toMatch(message);
  });

  it("allows any e and n when the instrument claims no legal-metrology class", () => {
    expect(InstrumentFormSchema.safeParse({ ...base, accuracyClass: "none", capacity: "40" }).success).toBe(true);
  });
});
