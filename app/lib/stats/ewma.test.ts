import { describe, expect, it } from "vitest";
import { ewmaAsymptoticLimits, ewmaChart } from "./ewma";
import { describeWithSharedData, readCsv } from "./shared-data.testing";

// NIST/SEMATECH e-Handbook §6.3.2.4 worked example (S, reproduced C): REFERENCE.md §6.
describeWithSharedData("EWMA: e-Handbook §6.3.2.4 example (target 50, s = 2.0539, λ = 0.3, k = 3)", () => {
  const rows = readCsv("NIST_6.3.2.4_EWMA_example.csv").filter((row) => row.x !== "");
  const values = rows.map((row) => Number(row.x));
  const chart = ewmaChart(values, 50, 2.0539, { lambda: 0.3, L: 3 });
  it.each(rows.map((row, i) => [i + 1, Number(row.ewma_published), i] as const))("t = %i: EWMA %f as published (2 dp)", (_t, published, i) => {
    expect(Math.abs(chart.z[i] - published)).toBeLessThanOrEqual(0.005 + 1e-12);
  });
  it("asymptotic limits 52.5884 / 47.4115 as printed (factor rounded to 0.4201 there: agree to 5e−4)", () => {
    const { ucl, lcl } = ewmaAsymptoticLimits(50, 2.0539, { lambda: 0.3, L: 3 });
    expect(ucl).toBeCloseTo(52.58843, 4);
    expect(lcl).toBeCloseTo(47.41157, 4);
    expect(Math.abs(ucl - 52.5884)).toBeLessThan(5e-4);
    expect(Math.abs(lcl - 47.4115)).toBeLessThan(5e-4);
    expect(chart.ucl[19]).toBeCloseTo(ucl, 5); // exact limits have converged by t = 20
  });
  it("no EWMA value outside the limits (the handbook's conclusion)", () => {
    expect(Array.from(chart.signal).every((s) => s === 0)).toBe(true);
  });
});

describe("ewmaChart: exact time-varying limits (DESIGN §3)", () => {
  it("first limit is centre ± Lσλ, since λ/(2 − λ)·(1 − (1 − λ)²) = λ²", () => {
    const chart = ewmaChart([0], 0, 1, { lambda: 0.2, L: 3 });
    expect(chart.ucl[0]).toBeCloseTo(0.6, 14);
    expect(chart.z[0]).toBe(0);
  });
  it("λ = 1 is the Shewhart chart: z = x, limits ± Lσ", () => {
    const chart = ewmaChart([1, 4, -2], 0, 1, { lambda: 1, L: 3 });
    expect(Array.from(chart.z)).toEqual([1, 4, -2]);
    expect(Array.from(chart.signal)).toEqual([0, 1, 0]);
  });
  it("empty input gives empty arrays", () => {
    expect(ewmaChart([], 0, 1).z.length).toBe(0);
  });
});
