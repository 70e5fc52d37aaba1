import { errorFunction } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { normalCdf, normalQuantile, studentTCdf, studentTQuantile, twoSidedTPValue } from "./distributions";

// Two-sided 95 % t critical values, NIST/SEMATECH e-Handbook §1.3.6.7.2 table (from memory, M; 3 dp).
describe("Student t quantiles t(0.975; ν) vs the e-Handbook t table (M)", () => {
  it.each([
    [1, 12.706], [2, 4.303], [3, 3.182], [5, 2.571], [10, 2.228], [20, 2.086], [30, 2.042], [100, 1.984],
  ])("ν = %i → %f", (df, published) => {
    expect(Math.abs(studentTQuantile(0.975, df) - published)).toBeLessThanOrEqual(0.0005);
  });
  it("round trip: F_t(t(p; ν); ν) = p (jstat cross-check of itself)", () => {
    for (const df of [1, 3, 8, 50]) for (const p of [0.01, 0.2, 0.5, 0.9, 0.995]) expect(studentTCdf(studentTQuantile(p, df), df)).toBeCloseTo(p, 7);
  });
  it("large ν tends to the normal quantile 1.959964 (GUM k = 2 ≈ 95.45 % note, REFERENCE.md §9)", () => {
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(normalQuantile(0.975), 5);
    expect(2 * normalCdf(2) - 1).toBeCloseTo(0.9545, 4);
  });
  it.each([[0, 5], [0.5, 0], [1, 5], [NaN, 5]])("p = %f, ν = %f → NaN", (p, df) => expect(studentTQuantile(p, df)).toBeNaN());
});

describe("normal distribution", () => {
  it("Φ agrees with (1 + erf(z/√2))/2 from simple-statistics to 1e−6 (its erf is good to about 1e−7)", () => {
    for (const z of [-3, -1.96, -0.5, 0, 0.7, 2, 3.5]) expect(normalCdf(z)).toBeCloseTo((1 + errorFunction(z / Math.SQRT2)) / 2, 6);
  });
  it("Φ⁻¹ inverts Φ and gives the familiar 1.959964 and 3.090232", () => {
    for (const p of [0.001, 0.025, 0.3, 0.5, 0.8, 0.975, 0.9999]) expect(normalCdf(normalQuantile(p))).toBeCloseTo(p, 12);
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalQuantile(0.999)).toBeCloseTo(3.090232, 6);
  });
  it("Φ(±∞), Φ⁻¹(0), Φ⁻¹(1)", () => {
    expect([normalCdf(Infinity), normalCdf(-Infinity), normalQuantile(0), normalQuantile(1)]).toEqual([1, 0, -Infinity, Infinity]);
  });
  it("two-sided p of t = 0 is 1 and of |t| = ∞ is 0", () => {
    expect(twoSidedTPValue(0, 10)).toBe(1);
    expect(twoSidedTPValue(-Infinity, 10)).toBe(0);
  });
});
