import { describe, expect, it } from "vitest";
import { forecastCrossings } from "./forecast";
import { fitLine, predict, predictionHalfWidth } from "./ols";

function seededNormal(seed: number): () => number {
  let state = seed;
  const uniform = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

// Synthetic drift (C): 100 g + 1 mg/day, noise 2 mg, 90 daily checks; tolerance ±0.2 g, guard band 0.05 g.
const noise = seededNormal(2024);
const days = Array.from({ length: 90 }, (_, i) => i);
const drifting = days.map((d) => 100 + 0.001 * d + 0.002 * noise());
const band = { upper: 100.2, lower: 99.8, guardBand: 0.05 };

describe("forecastCrossings", () => {
  const fit = fitLine(days, drifting)!;
  const forecast = forecastCrossings(fit, band, 89, 365);

  it("the line reaches the tolerance near the true day 200, inside the range the slope interval allows", () => {
    const earliest = (band.upper - fit.intercept) / fit.slopeHigh;
    const latest = (band.upper - fit.intercept) / fit.slopeLow;
    expect(forecast.toleranceAt).not.toBeNull();
    expect(forecast.toleranceAt!).toBeGreaterThanOrEqual(earliest);
    expect(forecast.toleranceAt!).toBeLessThanOrEqual(latest);
    expect(earliest).toBeLessThanOrEqual(200);
    expect(latest).toBeGreaterThanOrEqual(200);
  });

  it("acceptance (T − G) comes before tolerance; the prediction bound before the line", () => {
    expect(forecast.acceptanceAt!).toBeCloseTo((100.15 - fit.intercept) / fit.slope, 9);
    expect(forecast.acceptanceAt!).toBeLessThan(forecast.toleranceAt!);
    expect(forecast.earliestToleranceAt!).toBeLessThan(forecast.toleranceAt!);
    const x = forecast.earliestToleranceAt!;
    expect(predict(fit, x) + predictionHalfWidth(fit, x)).toBeCloseTo(band.upper, 6);
  });

  it("a drift away from the only limit, or a slope that is not significant, gives no line crossing", () => {
    expect(forecastCrossings(fit, { lower: 99.8 }, 89).toleranceAt).toBeNull();
    const flat = fitLine(days, days.map((d) => 100 + 0.002 * Math.sin(2.1 * d)))!; // scatter without drift
    expect(flat.pValue).toBeGreaterThan(0.05);
    const none = forecastCrossings(flat, band, 89, 365);
    expect([none.acceptanceAt, none.toleranceAt]).toEqual([null, null]);
    expect(none.earliestToleranceAt).toBeNull(); // ±0.2 g is far outside a 2 mg scatter
  });

  it("a bound already beyond the tolerance reaches it at once; a short horizon sees nothing", () => {
    expect(forecastCrossings(fit, { upper: 100.05 }, 89).earliestToleranceAt).toBe(89);
    expect(forecastCrossings(fit, band, 89, 10).earliestToleranceAt).toBeNull();
  });
});
