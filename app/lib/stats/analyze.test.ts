// Expected values: computed by hand from the definitions in DESIGN §3 (C) unless a published source is named.
import { describe, expect, it } from "vitest";
import { analyzeSeries } from "./analyze";
import { describeWithSharedData, readCsv, readDat } from "./shared-data.testing";

/** 20 in-control points (moving range 0.2, so σ̂ = 0.2/1.128) followed by `tail`. */
const baseline20 = Array.from({ length: 20 }, (_, i) => (i % 2 ? 9.9 : 10.1)); // ends below the centre
const sigma = 0.2 / 1.128;
const daily = (n: number) => Array.from({ length: n }, (_, i) => new Date(Date.UTC(2025, 0, 1 + i, 9)).toISOString());

describeWithSharedData("analyzeSeries on published examples", () => {
  it("e-Handbook §6.3.2.2 flow rate: limits 55.8041 / 45.8159, no run-rule signal", () => {
    const values = readCsv("NIST_6.3.2.2_individuals_flowrate.csv").map((row) => Number(row.x));
    const result = analyzeSeries({ values, baseline: { count: 10 } });
    expect(result.limits!.ucl).toBeCloseTo(55.8041, 4);
    expect(result.limits!.lcl).toBeCloseTo(45.8159, 4);
    expect(result.signals.filter((s) => s.rule.startsWith("nelson"))).toEqual([]);
    expect(result.trend!.per).toBe("point");
  });
  it("NIST StRD Mavro (r₁ = 0.938): warns that moving-range limits will mislead", () => {
    const result = analyzeSeries({ values: readDat("Mavro.dat") });
    expect(result.summary.lag1).toBeCloseTo(0.937989183438248, 9);
    expect(result.warnings.join(" ")).toMatch(/lag-1 autocorrelation 0\.94.*moving ranges/);
  });
});

describe("analyzeSeries", () => {
  it("a sustained shift: nelson-2 fires from the 9th point above the centre, once per episode", () => {
    const values = [...baseline20, ...Array(12).fill(10 + 0.5 * sigma)];
    const result = analyzeSeries({ values });
    const nelson2 = result.signals.filter((s) => s.rule === "nelson-2");
    expect(nelson2).toEqual([{ rule: "nelson-2", index: 28, message: "9 points in a row above the centre line" }]);
    expect(result.points.slice(28).every((p) => p.signals.includes("nelson-2"))).toBe(true);
    expect(result.points[27].signals).not.toContain("nelson-2");
    expect(result.baseline).toEqual({ count: 20, center: 10, sigma: expect.closeTo(sigma, 12) });
  });

  it("a step of 2σ̂ is caught by CUSUM (k = 0.5, h = 5) and EWMA (λ = 0.2, L = 3)", () => {
    const values = [...baseline20, ...Array(15).fill(10 + 2 * sigma)];
    const result = analyzeSeries({ values, rules: "none" });
    const rules = new Set(result.signals.map((s) => s.rule));
    expect(rules).toEqual(new Set(["ewma", "cusum-high"]));
    const cusum = result.signals.find((s) => s.rule === "cusum-high")!;
    expect(cusum.index).toBe(23); // C⁺ grows 1.5σ̂ a point: > 5σ̂ at the 4th shifted point
    expect(result.points[23].cusumHigh!).toBeCloseTo(6 * sigma, 10);
  });

  it("fewer than 8 baseline points: no limits, rules, EWMA or CUSUM, and a warning", () => {
    const result = analyzeSeries({ values: [1, 2, 3, 4, 5, 6, 7] });
    expect(result.baseline).toBeNull();
    expect(result.limits).toBeNull();
    expect(result.signals).toEqual([]);
    expect(result.points[0]).toEqual({ index: 0, value: 1, signals: [], ewma: null, ewmaUcl: null, ewmaLcl: null, cusumHigh: null, cusumLow: null });
    expect(result.warnings.join(" ")).toMatch(/7 points; at least 8 are needed/);
    expect(result.trend!.slope).toBeCloseTo(1, 12);
  });

  it("options: Western Electric rules only, EWMA and CUSUM off, given centre and sigma", () => {
    const result = analyzeSeries({ values: [0, 3.5, 0, 0], baseline: { center: 0, sigma: 1 }, rules: "western-electric", ewma: false, cusum: false });
    expect(result.signals).toEqual([{ rule: "we-1", index: 1, message: "1 point beyond 3σ above the centre line" }]);
    expect(result.points[1]).toMatchObject({ ewma: null, cusumHigh: null });
    expect(result.baseline).toEqual({ count: 0, center: 0, sigma: 1 });
  });

  it("readings that repeat at the readability: σ̂ raised to 0.41·d, with a warning", () => {
    const result = analyzeSeries({ values: Array(20).fill(100.0001), resolution: 0.0001 });
    expect(result.baseline!.sigma).toBeCloseTo(0.000041, 15);
    expect(result.warnings.join(" ")).toMatch(/0\.41·d/);
  });

  it("with times: trend per day and forecast as ISO instants; without: point indexes", () => {
    const values = Array.from({ length: 60 }, (_, i) => 100 + 0.001 * i + (i % 3) * 0.0005);
    const tolerance = { upper: 100.1, lower: 99.9, guardBand: 0.02 };
    const dated = analyzeSeries({ values, times: daily(60), tolerance });
    expect(dated.trend!.per).toBe("day");
    expect(dated.trend!.slope).toBeCloseTo(0.001, 4);
    expect(dated.forecast!.toleranceAt).toMatch(/^2025-04-1\dT/); // about day 100 after 1 January
    const byPoint = analyzeSeries({ values, tolerance });
    expect(Math.abs((byPoint.forecast!.toleranceAt as number) - 100)).toBeLessThan(1);
    expect(analyzeSeries({ values }).forecast).toBeNull();
  });

  it("rejects times of the wrong length or out of order", () => {
    expect(() => analyzeSeries({ values: [1, 2], times: daily(3) })).toThrow(RangeError);
    expect(() => analyzeSeries({ values: [1, 2], times: [daily(2)[1], daily(2)[0]] })).toThrow(/earlier/);
  });

  it("serialises to JSON with exactly the documented top-level names", () => {
    const result = JSON.parse(JSON.stringify(analyzeSeries({ values: [...baseline20, 12], times: daily(21), tolerance: { upper: 11 } })));
    expect(Object.keys(result).sort()).toEqual(["baseline", "forecast", "limits", "n", "points", "signals", "summary", "trend", "warnings"]);
    expect(Object.keys(result.points[0]).sort()).toEqual(["cusumHigh", "cusumLow", "ewma", "ewmaLcl", "ewmaUcl", "index", "signals", "value"]);
    expect(Object.keys(result.trend).sort()).toEqual(["mannKendallP", "pValue", "per", "slope", "slopeHigh", "slopeLow", "theilSen"]);
  });
  it("empty input", () => {
    const result = analyzeSeries({ values: [] });
    expect(result).toMatchObject({ n: 0, baseline: null, limits: null, points: [], signals: [], trend: null, forecast: null });
  });
});
