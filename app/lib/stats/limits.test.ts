import { describe, expect, it } from "vitest";
import { controlLimits, estimateBaseline, meanMovingRange } from "./limits";
import { describeWithSharedData, readCsv } from "./shared-data.testing";

// NIST/SEMATECH e-Handbook §6.3.2.2 flow-rate example (S, recomputed C): REFERENCE.md §6.
describeWithSharedData("individuals chart: e-Handbook §6.3.2.2 flow-rate example", () => {
  const values = readCsv("NIST_6.3.2.2_individuals_flowrate.csv").map((row) => Number(row.x));
  it("centre 50.81, MR̄ 1.8778, UCL 55.8041, LCL 45.8159 (3·MR̄/1.128), MR UCL 6.1347", () => {
    const baseline = estimateBaseline(values, { count: 10 });
    expect(baseline).not.toBeNull();
    const limits = controlLimits(baseline!);
    expect(limits.center).toBeCloseTo(50.81, 10);
    expect(meanMovingRange(values)).toBeCloseTo(1.8778, 4);
    expect(limits.ucl).toBeCloseTo(55.8041, 4);
    expect(limits.lcl).toBeCloseTo(45.8159, 4);
    expect(3.267 * meanMovingRange(values)).toBeCloseTo(6.1347, 4); // D4(2) = 3.267
    expect(values.every((x) => x < limits.ucl && x > limits.lcl)).toBe(true); // "process in control"
  });
});

describe("estimateBaseline", () => {
  const ramp = Array.from({ length: 30 }, (_, i) => 10 + (i % 2) * 0.2);
  it.each([
    { name: "fewer than 8 points", values: ramp.slice(0, 7), spec: undefined, resolution: undefined, expected: null },
    { name: "count 7 asked", values: ramp, spec: { count: 7 }, resolution: undefined, expected: null },
    { name: "default count 20", values: ramp, spec: undefined, resolution: undefined, expected: { count: 20, sigma: 0.2 / 1.128, sigmaSource: "moving-range" } },
    { name: "count beyond the series is cut to its length", values: ramp.slice(0, 9), spec: { count: 20 }, resolution: undefined, expected: { count: 9, sigma: 0.2 / 1.128, sigmaSource: "moving-range" } },
    { name: "0.41·d floor (USP <41>) when the readings repeat", values: Array(12).fill(5), spec: undefined, resolution: 0.01, expected: { count: 12, sigma: 0.0041, sigmaSource: "resolution-floor" } },
    { name: "zero variance without d", values: Array(12).fill(5), spec: undefined, resolution: undefined, expected: null },
    { name: "given centre and sigma", values: [], spec: { center: 3, sigma: 0.5 }, resolution: undefined, expected: { count: 0, sigma: 0.5, sigmaSource: "given" } },
    { name: "given sigma 0", values: [], spec: { center: 3, sigma: 0 }, resolution: undefined, expected: null },
  ])("$name", ({ values, spec, resolution, expected }) => {
    const baseline = estimateBaseline(values, spec, resolution);
    if (expected === null) return expect(baseline).toBeNull();
    expect(baseline).toMatchObject({ count: expected.count, sigmaSource: expected.sigmaSource });
    expect(baseline!.sigma).toBeCloseTo(expected.sigma, 12);
  });

  it("limits are centre ± 1, 2, 3 σ̂", () => {
    expect(controlLimits({ center: 10, sigma: 0.5 })).toEqual({
      center: 10, sigma: 0.5, ucl: 11.5, lcl: 8.5, uwl: 11, lwl: 9, upperOneSigma: 10.5, lowerOneSigma: 9.5,
    });
  });
});
