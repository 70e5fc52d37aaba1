import { describe, expect, it } from "vitest";
import { normalCdf } from "./distributions";
import { mannKendall } from "./mann-kendall";
import { mannKendallDirect } from "./mann-kendall-direct.testing";

describe("mannKendall", () => {
  // Known cases computed by hand from the definitions (C).
  it.each([
    { name: "1…5 rising", values: [1, 2, 3, 4, 5], s: 10, variance: 250 / 15, p: 2 * (1 - normalCdf(9 / Math.sqrt(250 / 15))) },
    { name: "ties: 1, 2, 2, 3", values: [1, 2, 2, 3], s: 5, variance: 138 / 18, p: 2 * (1 - normalCdf(4 / Math.sqrt(138 / 18))) },
    { name: "falling 4…1", values: [4, 3, 2, 1], s: -6, variance: 156 / 18, p: 2 * (1 - normalCdf(5 / Math.sqrt(156 / 18))) },
  ])("$name: S = $s", ({ values, s, variance, p }) => {
    const result = mannKendall(values);
    expect(result.s).toBe(s);
    expect(result.variance).toBeCloseTo(variance, 12);
    expect(result.pValue).toBeCloseTo(p, 12);
  });
  it("1…5: z = 9/√16.67 = 2.2045, p = 0.0275 (hand calculation, C)", () => {
    const result = mannKendall([1, 2, 3, 4, 5]);
    expect(result.z).toBeCloseTo(2.2045, 4);
    expect(result.pValue).toBeCloseTo(0.0275, 4);
  });
  it("matches the O(n²) definition on 600 quantised values with many ties", () => {
    let state = 11;
    const values = Array.from({ length: 600 }, (_, i) => Math.round(((state = (state * 16807) % 2147483647) / 2147483647) * 8 + i / 200));
    const reference = mannKendallDirect(values);
    const result = mannKendall(values);
    expect(result.s).toBe(reference.s);
    expect(result.variance).toBeCloseTo(reference.variance, 6);
  });
  it.each([
    { name: "empty", values: [] },
    { name: "one point", values: [3] },
    { name: "all tied", values: [2, 2, 2, 2] },
  ])("$name: S = 0, p = 1", ({ values }) => {
    expect(mannKendall(values)).toMatchObject({ s: 0, pValue: 1 });
  });
});
