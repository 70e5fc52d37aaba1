import { mean as ssMean, sampleStandardDeviation as ssSd } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { certifiedValue, correctDigits, describeWithSharedData, readDat } from "./shared-data.testing";
import { autocorrelationWarning, decimalGrid, summarize } from "./summary";

// NIST StRD univariate summary statistics, certified values (REFERENCE.md §7, P), read from each file's header.
describeWithSharedData("NIST StRD univariate summary statistics (certified values in the .dat headers)", () => {
  const datasets = ["Michelso.dat", "Mavro.dat", "NumAcc1.dat", "NumAcc2.dat", "NumAcc3.dat", "NumAcc4.dat"];
  it.each(datasets)("%s: mean, s (n − 1) and lag-1 autocorrelation to at least 9 significant digits", (file) => {
    const values = readDat(file);
    const result = summarize(values);
    const certified = file.startsWith("NumAcc")
      ? // The constructed sets state their certified values in words in the header; REFERENCE.md §7 lists them.
        { mean: { "NumAcc1.dat": 10000002, "NumAcc2.dat": 1.2, "NumAcc3.dat": 1000000.2, "NumAcc4.dat": 10000000.2 }[file]!, sd: file === "NumAcc1.dat" ? 1 : 0.1, lag1: file === "NumAcc1.dat" ? -0.5 : -0.999 }
      : {
          mean: certifiedValue(file, "Sample Mean ybar"),
          sd: certifiedValue(file, "Sample Standard Deviation (n-1) s"),
          lag1: certifiedValue(file, "Sample Autocorrelation Coef. lag1 r(1)"),
        };
    expect(result.n).toBe(values.length);
    expect(correctDigits(result.mean, certified.mean)).toBeGreaterThanOrEqual(9);
    expect(correctDigits(result.sd, certified.sd)).toBeGreaterThanOrEqual(9);
    expect(correctDigits(result.lag1, certified.lag1)).toBeGreaterThanOrEqual(9);
  });

  it("NumAcc4: s is exact because the readings sit on a 0.1 grid (a plain two-pass gives only about 8.3 digits)", () => {
    const values = readDat("NumAcc4.dat");
    expect(decimalGrid(values)).toBe(1);
    expect(summarize(values).sd).toBe(0.1);
  });
});

describe("summarize: edge cases", () => {
  it.each([
    { name: "empty input", values: [], expected: { n: 0, mean: NaN, sd: NaN, lag1: NaN } },
    { name: "one point", values: [5.25], expected: { n: 1, mean: 5.25, sd: NaN, lag1: NaN } },
    { name: "zero variance", values: [2.5, 2.5, 2.5], expected: { n: 3, mean: 2.5, sd: 0, lag1: NaN } },
    { name: "two points", values: [1, 3], expected: { n: 2, mean: 2, sd: Math.SQRT2, lag1: -0.5 } },
  ])("$name", ({ values, expected }) => {
    const result = summarize(values);
    expect(result.n).toBe(expected.n);
    for (const key of ["mean", "sd", "lag1"] as const) {
      if (Number.isNaN(expected[key])) expect(result[key]).toBeNaN();
      else expect(result[key]).toBeCloseTo(expected[key], 14);
    }
  });

  it("agrees with simple-statistics on off-grid random data (cross-check)", () => {
    let state = 42;
    const values = Array.from({ length: 500 }, () => ((state = (state * 16807) % 2147483647) / 2147483647) * 3 + Math.PI);
    expect(decimalGrid(values)).toBeNull();
    const result = summarize(values);
    expect(result.mean).toBeCloseTo(ssMean(values), 12);
    expect(result.sd).toBeCloseTo(ssSd(values), 12);
  });
});

describe("decimalGrid", () => {
  it.each([
    { values: [1, 2, 3], grid: 0 },
    { values: [100.0001, 99.9999], grid: 4 },
    { values: [0.1 + 0.2], grid: 1 },
    { values: [Math.PI], grid: null },
    { values: [], grid: null },
  ])("$values → $grid", ({ values, grid }) => {
    expect(decimalGrid(values)).toBe(grid);
  });
});

describe("autocorrelationWarning (threshold 0.5: our choice, common practice for individuals charts)", () => {
  it.each([
    { lag1: 0.54, warns: true },
    { lag1: -0.7, warns: true },
    { lag1: 0.5, warns: false },
    { lag1: 0.1, warns: false },
    { lag1: NaN, warns: false },
  ])("r₁ = $lag1 → warns: $warns", ({ lag1, warns }) => {
    const warning = autocorrelationWarning(lag1);
    expect(warning !== null).toBe(warns);
    if (warning) expect(warning).toMatch(/moving ranges/);
  });
});
