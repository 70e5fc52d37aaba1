// Fast paths against their reference definitions (C): Mann–Kendall by counting grid steps against the O(n²) sum,
// epoch-ms times against ISO strings, selection by buckets against a sort, grid codes against comparisons.
import { describe, expect, it } from "vitest";
import { analyzeSeries } from "./analyze";
import { codeInversions, gridCodes, sortByCode } from "./grid-sort";
import { mannKendall } from "./mann-kendall";
import { mannKendallDirect } from "./mann-kendall-direct.testing";
import { selectPairByBuckets } from "./select";
import { theilSenAndMannKendall, theilSenSlope } from "./theil-sen";
import { daysSinceFirst, daysSinceFirstMs } from "./time-axis";

function seeded(seed: number): () => number {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

/** n readings of a 100 g check read to 0.1 mg: 100 + drift·i + noise, rounded to d. */
function readings(n: number, seed: number, drift = 0): number[] {
  const random = seeded(seed);
  return Array.from({ length: n }, (_, i) => Math.round((100 + drift * i + 0.0003 * (random() + random() - 1)) / 1e-4) * 1e-4);
}

describe("Mann–Kendall by grid steps", () => {
  it.each([0, 2e-7, -1e-6])("S and Var(S) equal the O(n²) definition on 1 100 readings rounded to d (drift %s)", (drift) => {
    const values = readings(1100, 77, drift);
    expect(mannKendall(values)).toMatchObject(mannKendallDirect(values));
    // Off the grid (a few values nudged by 1e−9) the merge sort counts instead: still the definition.
    const nudged = values.map((v, i) => (i % 97 === 0 ? v + 1e-9 : v));
    expect(mannKendall(nudged)).toMatchObject(mannKendallDirect(nudged));
  });
  it("theilSenAndMannKendall gives what theilSenSlope and mannKendall give apart", () => {
    const y = readings(1100, 5, 1e-6);
    const x = y.map((_, i) => i + (i % 7) / 24);
    const both = theilSenAndMannKendall(x, y);
    expect(both.theilSen).toBe(theilSenSlope(x, y));
    expect(both.mannKendall).toEqual(mannKendall(y));
  });
});

describe("grid codes", () => {
  it("inversions and a stable order equal comparison sorting; null off the grid or for a wide range", () => {
    const values = readings(500, 9, 3e-7);
    const grid = gridCodes(values)!;
    let inversions = 0;
    for (let i = 0; i < values.length; i++) for (let j = i + 1; j < values.length; j++) if (values[j] < values[i]) inversions++;
    expect(codeInversions(grid)).toBe(inversions);
    const order = new Int32Array(values.length);
    const sorted = new Float64Array(values.length);
    sortByCode(grid, order, sorted);
    const expected = values.map((_, i) => i).sort((a, b) => values[a] - values[b] || a - b);
    expect(Array.from(order)).toEqual(expected);
    expect(Array.from(sorted)).toEqual(expected.map((i) => values[i]));
    expect(gridCodes([1, 2, Math.PI])).toBeNull();
    expect(gridCodes([0, 1e6])).toBeNull();
  });
});

describe("analyzeSeries with epoch-ms times", () => {
  it("gives exactly what ISO times give, forecast instants included", () => {
    const start = Date.UTC(2024, 0, 8, 7, 30);
    const random = seeded(11);
    const timesMs = Array.from({ length: 400 }, (_, i) => start + i * 86_400_000 + Math.floor(random() * 3_600_000));
    const values = readings(400, 12, 4e-6);
    const tolerance = { upper: 100.05, lower: 99.95, guardBand: 0.01 };
    const iso = analyzeSeries({ values, times: timesMs.map((t) => new Date(t).toISOString()), resolution: 1e-4, tolerance });
    const ms = analyzeSeries({ values, timesMs: Float64Array.from(timesMs), resolution: 1e-4, tolerance });
    expect(ms).toEqual(iso);
    expect(iso.forecast!.toleranceAt).toMatch(/^20\d\d-/);
  });
  it("rejects both kinds of times, a length mismatch, and times out of order or not finite", () => {
    expect(() => analyzeSeries({ values: [1, 2], times: ["2025-01-01", "2025-01-02"], timesMs: [0, 1] })).toThrow(/not both/);
    expect(() => analyzeSeries({ values: [1, 2], timesMs: [0] })).toThrow(RangeError);
    expect(() => daysSinceFirstMs([5, 4])).toThrow(/earlier/);
    expect(() => daysSinceFirstMs([0, Number.NaN])).toThrow(/epoch milliseconds/);
    expect(Array.from(daysSinceFirstMs([Date.UTC(2025, 0, 1), Date.UTC(2025, 0, 1, 12)]))).toEqual(Array.from(daysSinceFirst(["2025-01-01", "2025-01-01T12:00:00Z"])));
  });
});

describe("selectPairByBuckets", () => {
  it.each([10, 5000, 20_000])("ranks k and k + 1 equal a full sort (%i values with repeats)", (n) => {
    const random = seeded(n);
    const values = Float64Array.from({ length: n }, () => Math.round(random() * n) / 7 - (random() < 0.01 ? 1e6 : 0));
    const sorted = Float64Array.from(values).sort();
    for (const k of [0, Math.floor(n / 3), n >> 1, n - 2, n - 1]) {
      expect(selectPairByBuckets(Float64Array.from(values), k)).toEqual([sorted[k], k + 1 < n ? sorted[k + 1] : Number.NaN]);
    }
  });
});
