import { inServiceMpe, type AccuracyClass } from "./oiml-r76";

export type Outcome = "in_tolerance" | "guard_band" | "out_of_tolerance";

/** USP <41> accuracy: the indication is within 0.10 % of the test weight's value. */
export const USP_ACCURACY_FRACTION = 0.001;
/** JCGM 106 leaves the guard band to the user; one third of the tolerance is a common default (common practice). */
export const DEFAULT_GUARD_BAND_FRACTION = 1 / 3;

export type ToleranceSpec =
  | { kind: "absolute"; grams: number }
  | { kind: "percent-of-load"; percent: number }
  | { kind: "usp-41" }
  | { kind: "oiml-r76-in-service"; accuracyClass: AccuracyClass; e: number };

export type GuardBandSpec = { kind: "fraction"; fraction?: number } | { kind: "uncertainty"; expandedUncertainty: number };

export interface Judgement {
  tolerance: number;
  guardBand: number;
  acceptance: number;
  outcome: Outcome;
}

/** Tolerance T in grams for a load in grams: absolute; percent/100·|load|; USP <41> 0.001·|load|; or the R 76 in-service mpe. */
export function toleranceLimit(spec: ToleranceSpec, load: number): number {
  switch (spec.kind) {
    case "absolute":
      return spec.grams;
    case "percent-of-load":
      return (spec.percent / 100) * Math.abs(load);
    case "usp-41":
      return USP_ACCURACY_FRACTION * Math.abs(load);
    case "oiml-r76-in-service":
      return inServiceMpe(spec.accuracyClass, spec.e, load);
  }
}

/** Guard band G in grams: fraction·T (default 1/3) or the check's expanded uncertainty U (k = 2); never negative. */
export function guardBand(spec: GuardBandSpec, tolerance: number): number {
  const g = spec.kind === "fraction" ? (spec.fraction ?? DEFAULT_GUARD_BAND_FRACTION) * tolerance : spec.expandedUncertainty;
  return Math.max(0, g);
}

/** Outcome of a result r against tolerance T and acceptance A = T − G: |r| ≤ A in tolerance, ≤ T guard band, else out (NaN r is out). */
export function classifyResult(result: number, tolerance: number, acceptance: number): Outcome {
  const size = Math.abs(result);
  if (size <= acceptance) return "in_tolerance";
  if (size <= tolerance) return "guard_band";
  return "out_of_tolerance";
}

/** T, G, A = max(0, T − G) and the outcome of a result (g) at a load (g); a guard band wider than T leaves A = 0. */
export function judgeResult(result: number, load: number, tolerance: ToleranceSpec, guard: GuardBandSpec = { kind: "fraction" }): Judgement {
  const t = toleranceLimit(tolerance, load);
  const g = guardBand(guard, t);
  const acceptance = Math.max(0, t - g);
  return { tolerance: t, guardBand: g, acceptance, outcome: classifyResult(result, t, acceptance) };
}
