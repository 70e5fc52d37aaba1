import { linearRegression, rSquared } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { studentTQuantile } from "./distributions";
import { fitLine, predictionHalfWidth } from "./ols";

/** Park–Miller generator with Box–Muller, so every run draws the same "noise". */
function seededNormal(seed: number): () => number {
  let state = seed;
  const uniform = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

describe("fitLine (OLS)", () => {
  it("agrees with simple-statistics linearRegression (cross-check)", () => {
    const noise = seededNormal(7);
    const x = Array.from({ length: 40 }, (_, i) => i * 1.5);
    const y = x.map((xi) => 2 + 0.03 * xi + 0.1 * noise());
    const fit = fitLine(x, y)!;
    const reference = linearRegression(x.map((xi, i) => [xi, y[i]]));
    expect(fit.slope).toBeCloseTo(reference.m, 12);
    expect(fit.intercept).toBeCloseTo(reference.b, 12);
    const line = (xi: number) => fit.intercept + fit.slope * xi;
    const r2 = rSquared(x.map((xi, i) => [xi, y[i]]), line);
    // t² = r²(n − 2)/(1 − r²) links the p-value to R²: same t from both routes.
    const t = fit.slope / fit.slopeStandardError;
    expect(t * t).toBeCloseTo((r2 * 38) / (1 - r2), 8);
    expect(fit.slopeHigh - fit.slope).toBeCloseTo(studentTQuantile(0.975, 38) * fit.slopeStandardError, 12);
  });

  it("recovers the true slope within its 95 % CI for 19 of 20 seeded noisy lines or better", () => {
    let covered = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const noise = seededNormal(seed * 7919);
      const x = Array.from({ length: 30 }, (_, i) => i);
      const fit = fitLine(x, x.map((xi) => 100 - 0.002 * xi + 0.01 * noise()))!;
      if (fit.slopeLow <= -0.002 && -0.002 <= fit.slopeHigh) covered++;
    }
    expect(covered).toBeGreaterThanOrEqual(18);
  });

  it.each([
    { name: "fewer than 2 points", x: [1], y: [2], expected: null },
    { name: "all x equal", x: [3, 3, 3], y: [1, 2, 3], expected: null },
  ])("$name → null", ({ x, y, expected }) => expect(fitLine(x, y)).toBe(expected));

  it("two points: slope, no interval (n − 2 = 0 df)", () => {
    const fit = fitLine([0, 2], [1, 5])!;
    expect(fit.slope).toBe(2);
    expect(fit.slopeLow).toBeNaN();
    expect(fit.pValue).toBeNaN();
  });

  it("a perfect line has zero standard error and p = 0; a flat perfect line p = 1", () => {
    expect(fitLine([0, 1, 2, 3], [1, 3, 5, 7])!.pValue).toBe(0);
    expect(fitLine([0, 1, 2, 3], [4, 4, 4, 4])!.pValue).toBe(1);
  });

  it("prediction half-width t·s·√(1 + 1/n + (x − x̄)²/Sxx) is smallest at x̄", () => {
    const noise = seededNormal(3);
    const x = Array.from({ length: 12 }, (_, i) => i);
    const fit = fitLine(x, x.map((xi) => xi + noise()))!;
    const atMean = predictionHalfWidth(fit, fit.xMean);
    expect(atMean).toBeCloseTo(fit.tCritical * fit.residualSd * Math.sqrt(1 + 1 / 12), 12);
    expect(predictionHalfWidth(fit, 30)).toBeGreaterThan(atMean);
  });
});
