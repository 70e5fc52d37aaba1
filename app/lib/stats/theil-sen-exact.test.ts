// The fast Theil–Sen path against the direct definition, bit for bit (toBe), on seeded data shaped like check
// series: readings rounded to the readability d, drifts up and down, steps, several checks a day (C).
import { describe, expect, it } from "vitest";
import { theilSenSlope, theilSenSlopeTuned } from "./theil-sen";

/** Median of all (yⱼ − yᵢ)/(xⱼ − xᵢ), xᵢ ≠ xⱼ, over the points in x-then-y order (mean of the middle two for an even count). */
function direct(x: number[], y: number[]): number {
  const order = x.map((_, i) => i).sort((a, b) => x[a] - x[b] || y[a] - y[b]);
  const slopes: number[] = [];
  for (let a = 0; a < order.length; a++) {
    for (let b = a + 1; b < order.length; b++) {
      const [i, j] = [order[a], order[b]];
      if (x[i] !== x[j]) slopes.push((y[j] - y[i]) / (x[j] - x[i]));
    }
  }
  const sorted = Float64Array.from(slopes).sort();
  const m = sorted.length;
  return m % 2 ? sorted[m >> 1] : (sorted[m / 2 - 1] + sorted[m / 2]) / 2;
}

function seeded(seed: number): () => number {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

interface Shape {
  name: string;
  n: number;
  grid: number;
  drift: number;
  /** 0: daily at a random minute; 1: whole days, several checks on some; 2: point indexes. */
  spacing: 0 | 1 | 2;
  step?: number;
  reversed?: boolean;
}

function series({ n, grid, drift, spacing, step = 0, reversed = false }: Shape, seed: number): { x: number[]; y: number[] } {
  const random = seeded(seed);
  let day = 0;
  const x = Array.from({ length: n }, (_, i) => (spacing === 2 ? i : spacing === 1 ? (day += Math.floor(random() * 3)) : i + random() / 24));
  const y = x.map((xi, i) => {
    const value = 100 + drift * xi + (i > n / 2 ? step : 0) + 0.0002 * (random() + random() + random() - 1.5);
    return grid ? Math.round(value / grid) * grid : value;
  });
  return reversed ? { x: x.reverse(), y: y.reverse() } : { x, y };
}

const shapes: Shape[] = [
  { name: "no drift on a 0.1 mg grid (median inside the block of zero slopes)", n: 1100, grid: 1e-4, drift: 0, spacing: 0 },
  { name: "upward drift on the grid", n: 1100, grid: 1e-4, drift: 1.5e-6, spacing: 0 },
  { name: "downward drift on the grid", n: 1100, grid: 1e-4, drift: -1.5e-6, spacing: 0 },
  { name: "drift just above the zero block", n: 900, grid: 1e-4, drift: 1e-7, spacing: 0 },
  { name: "a step of 3 d halfway", n: 1000, grid: 1e-4, drift: 0, spacing: 0, step: 3e-4 },
  { name: "continuous values, no ties", n: 800, grid: 0, drift: 4e-7, spacing: 0 },
  { name: "continuous values falling", n: 800, grid: 0, drift: -4e-7, spacing: 0 },
  { name: "several checks a day (ties in x)", n: 900, grid: 1e-4, drift: 2e-6, spacing: 1 },
  { name: "several checks a day, falling", n: 900, grid: 1e-4, drift: -2e-6, spacing: 1 },
  { name: "coarse 1 mg grid by point index (large blocks of equal slopes)", n: 700, grid: 1e-3, drift: 4e-6, spacing: 2 },
  { name: "unsorted input (reversed times)", n: 600, grid: 1e-4, drift: 1e-6, spacing: 0, reversed: true },
  { name: "short series just past the brute-force size", n: 220, grid: 1e-4, drift: 3e-6, spacing: 0 },
];

describe("theilSenSlope by selection equals the direct definition exactly", () => {
  it.each(shapes)("$name", (shape) => {
    for (const seed of [1, 2, 3]) {
      const { x, y } = series(shape, seed * 7919 + shape.n);
      expect(theilSenSlope(x, y)).toBe(direct(x, y));
    }
  });

  // The estimate almost never misses on such data, so its fallbacks are forced here: brackets from the sample,
  // and narrowing by probes as for series of 100 000 points.
  it.each(shapes.slice(0, 10))("fallback paths: $name", (shape) => {
    const { x, y } = series(shape, 4242 + shape.n);
    const expected = direct(x, y);
    expect(theilSenSlopeTuned(x, y, { estimate: false, maxList: null })).toBe(expected);
    expect(theilSenSlopeTuned(x, y, { estimate: false, maxList: 2000 })).toBe(expected);
    expect(theilSenSlopeTuned(x, y, { estimate: true, maxList: 500 })).toBe(expected);
  });

  it.each([
    { name: "two points", x: [0, 4], y: [1, 3] },
    { name: "even count", x: [0, 1, 2, 3], y: [0, 1, 3, 3] },
    { name: "all slopes zero", x: [0, 1, 2, 3, 4], y: [5, 5, 5, 5, 5] },
    { name: "ties in x and y", x: [0, 0, 1, 1, 2, 2, 3], y: [1, 1, 2, 1, 3, 3, 2] },
    { name: "a perfect line: one block of equal slopes", x: Array.from({ length: 300 }, (_, i) => i), y: Array.from({ length: 300 }, (_, i) => 2 * i + 1) },
  ])("selection on tiny inputs: $name", ({ x, y }) => {
    expect(theilSenSlopeTuned(x, y, { estimate: true, maxList: null })).toBe(direct(x, y));
    expect(theilSenSlopeTuned(x, y, { estimate: false, maxList: 8 })).toBe(direct(x, y));
  });

  it("NaN for a non-finite value", () => {
    const { x, y } = series(shapes[1], 5);
    y[100] = Number.NaN;
    expect(theilSenSlope(x, y)).toBeNaN();
  });
});
