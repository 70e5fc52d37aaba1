import { describe, expect, it } from "vitest";
import { parseReadings, readingText } from "./check-readings";
import { decimalsAllowed, formatMass, shiftDecimal, toGrams } from "./units";

describe("unit conversion moves the decimal point exactly", () => {
  it.each([
    ["100.0003", "g", "100.0003"],
    ["12.5", "mg", "0.0125"],
    ["0.001", "mg", "0.000001"],
    ["60", "kg", "60000"],
    ["0.1", "kg", "100"],
    ["-0.2", "mg", "-0.0002"],
  ] as const)("%s %s = %s g", (text, unit, grams) => {
    expect(toGrams(text, unit)).toBe(grams);
  });

  it("keeps digits a float would lose", () => {
    // 0.1 + 0.2 style error: 0.0003 kg as a float is 0.30000000000000004 g
    expect(shiftDecimal("0.0003", 3)).toBe("0.3");
    expect(toGrams("10000000.000001", "g")).toBe("10000000.000001");
  });
});

describe("decimals against the readability d", () => {
  it.each([
    ["0.0001", "g", 4],
    ["0.0001", "mg", 1], // 0.1 mg
    ["0.000001", "mg", 3], // 0.001 mg on a micro balance
    ["2", "kg", 3], // 2 g read in kg: 0.002 kg
    ["100", "kg", 1],
  ] as const)("d = %s g read in %s allows %i decimals", (d, unit, decimals) => {
    expect(decimalsAllowed(d, unit)).toBe(decimals);
  });

  it("formats a mass with the digits d allows and the unit", () => {
    expect(formatMass(100.00031, "g", "0.0001")).toBe("100.0003 g");
    expect(formatMass("0.0125", "mg", "0.000001")).toBe("12.500 mg");
  });
});

describe("readings as typed", () => {
  it("accept a decimal comma and the check's own unit inside the cell", () => {
    expect(readingText("100,0003", "g")).toBe("100.0003");
    expect(readingText(" 100.0003 g ", "g")).toBe("100.0003");
    expect(readingText("100.0003 mg", "g")).toBeNull();
  });

  it("stores sensitivity readings exactly as entered, trailing zeros included", () => {
    const parsed = parseReadings(["100.0000"], { type: "sensitivity", unit: "g", readabilityG: "0.0001" });
    expect(parsed).toEqual({ ok: true, readings: [{ entered: "100.0000", grams: 100, position: null }] });
  });

  it.each([
    [["100.00002"], /more decimals than this instrument shows \(d allows 4 in g\)/],
    [["abc"], /is not a reading in g/],
    [["-1.0000"], /cannot be negative/],
    [[], /at least one reading/],
  ])("refuse %j", (readings, message) => {
    const parsed = parseReadings(readings, { type: "sensitivity", unit: "g", readabilityG: "0.0001" });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.problems[0].message).toMatch(message);
  });

  it("ask for at least 6 repeatability readings (the trade uses 6 to 10, USP <41> asks for 10)", () => {
    const parsed = parseReadings(["10.0001", "10.0002", "10.0001"], { type: "repeatability", unit: "g", readabilityG: "0.0001" });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.problems[0].message).toMatch(/at least 6/);
  });

  it("need all five eccentricity positions and name the missing one", () => {
    const parsed = parseReadings({ centre: "200.0000", "front-left": "200.0001", "back-left": "200.0000", "back-right": "199.9999" }, { type: "eccentricity", unit: "g", readabilityG: "0.0001" });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.problems).toEqual([{ pointer: "/readings/front-right", message: "The front-right reading is missing." }]);
  });
});
