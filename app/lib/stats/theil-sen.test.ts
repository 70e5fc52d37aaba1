import { TheilSenRegression } from "ml-regression-theil-sen";
import { describe, expect, it } from "vitest";
import { theilSenSlope } from "./theil-sen";

/** Direct definition: median of all pairwise slopes with distinct x (mean of the two middle ones for an even count). */
function bruteForceTheilSen(x: number[], y: number[]): number {
  const slopes: number[] = [];
  for (let i = 0; i < x.length; i++) for (let j = i + 1; j < x.length; j++) if (x[i] !== x[j]) slopes.push((y[j] - y[i]) / (x[j] - x[i]));
  slopes.sort((a, b) => a - b);
  const m = slopes.length;
  return m % 2 ? slopes[m >> 1] : (slopes[m / 2 - 1] + slopes[m / 2]) / 2;
}

function seeded(seed: number): () => number {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

describe("theilSenSlope", () => {
  // ml-regression-theil-sen takes the lower middle slope for an even count, so compare on odd pair counts.
  it.each([6, 7, 50, 51, 150])("n = %i: equals ml-regression-theil-sen (cross-check, odd pair count)", (n) => {
    const random = seeded(n);
    const x = Array.from({ length: n }, (_, i) => i + random());
    const y = x.map((xi) => 5 + 0.2 * xi + random() * 3);
    if (((n * (n - 1)) / 2) % 2 === 0) return expect(n % 4 === 0 || n % 4 === 1).toBe(true);
    expect(theilSenSlope(x, y)).toBe(new TheilSenRegression(x, y).slope);
  });

  const large = [
    { name: "continuous noise", n: 1100, grid: 0, xTies: false, drift: 1e-5 },
    { name: "readings on a 0.1 mg grid", n: 1100, grid: 1e-4, xTies: false, drift: 1e-6 },
    { name: "grid and no drift (median slope 0, many ties)", n: 1100, grid: 1e-4, xTies: false, drift: 0 },
    { name: "several points per day (ties in x)", n: 900, grid: 1e-4, xTies: true, drift: 2e-6 },
    { name: "coarse grid, tiny n of distinct values", n: 700, grid: 1e-3, xTies: true, drift: 0 },
    { name: "unsorted x", n: 400, grid: 0, xTies: false, drift: -3e-5 },
  ];
  it.each(large)("large n by slope selection equals the direct definition: $name", ({ n, grid, xTies, drift }) => {
    const random = seeded(n + Math.round(drift * 1e7) + (xTies ? 1 : 0));
    let day = 0;
    const x = Array.from({ length: n }, () => (day += xTies ? Math.floor(random() * 3) : 0.5 + random()));
    if (drift < 0) x.reverse();
    const y = x.map((xi) => {
      const value = 100 + drift * xi + 0.0003 * (random() + random() + random() - 1.5);
      return grid ? Math.round(value / grid) * grid : value;
    });
    const expected = bruteForceTheilSen(x, y);
    expect(Math.abs(theilSenSlope(x, y) - expected)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(expected), 1e-12));
  });

  it.each([
    { name: "empty", x: [], y: [], expected: NaN },
    { name: "one point", x: [1], y: [1], expected: NaN },
    { name: "all x equal", x: [2, 2, 2], y: [1, 2, 3], expected: NaN },
    { name: "two points", x: [0, 4], y: [1, 3], expected: 0.5 },
    { name: "even count averages the middle slopes", x: [0, 1, 2, 3], y: [0, 1, 3, 3], expected: 1 },
    { name: "zero variance", x: [0, 1, 2], y: [5, 5, 5], expected: 0 },
  ])("$name", ({ x, y, expected }) => {
    if (Number.isNaN(expected)) expect(theilSenSlope(x, y)).toBeNaN();
    else expect(theilSenSlope(x, y)).toBeCloseTo(expected, 14);
  });
});
