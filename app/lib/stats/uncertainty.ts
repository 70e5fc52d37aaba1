/** Expanded uncertainty U = k·u with k = 2 (≈ 95 %, GUM / NIST TN 1297 §6.2). */
export const DEFAULT_COVERAGE_FACTOR = 2;

export interface IndicationUncertaintyInput {
  /** Readability d at the load, g; the zero reading uses `zeroReadability` when given. */
  readability: number;
  zeroReadability?: number;
  /** Indication I of the check, g. */
  indication: number;
  /** Repeatability standard deviation s, g. */
  repeatabilitySd?: number;
  /** Largest |ΔI| of the eccentricity test (g) and the load it was found with (g). */
  eccentricity?: { maxAbsDeviation: number; load: number };
  /** Test weight: certificate U (k = 2) in g, or class mpe in g when only the class is known. */
  testWeight?: { expandedUncertainty: number } | { classMpe: number };
  coverageFactor?: number;
}

export interface UncertaintyBudget {
  roundingZero: number;
  roundingLoad: number;
  repeatability: number;
  eccentricity: number;
  testWeight: number;
  combined: number;
  expanded: number;
  coverageFactor: number;
}

/** Rounding standard uncertainty d/√12 of one reading (rectangular over ±d/2), in the units of d. */
export function roundingUncertainty(readability: number): number {
  return readability / Math.sqrt(12);
}

/** Eccentricity share |ΔI|max·I/(2·L_ecc·√3) (rectangular), g; 0 when L_ecc ≤ 0. */
export function eccentricityUncertainty(maxAbsDeviation: number, eccentricityLoad: number, indication: number): number {
  if (!(eccentricityLoad > 0)) return 0;
  return (Math.abs(maxAbsDeviation) * Math.abs(indication)) / (2 * eccentricityLoad * Math.sqrt(3));
}

/** EURAMET cg-18 style budget of one indication (g): d/√12 for zero and load, s, eccentricity share, test weight U/2 or mpe/√3; u = root sum of squares, U = k·u (k = 2); missing inputs contribute 0. */
export function indicationUncertainty(input: IndicationUncertaintyInput): UncertaintyBudget {
  const k = input.coverageFactor ?? DEFAULT_COVERAGE_FACTOR;
  const roundingZero = roundingUncertainty(input.zeroReadability ?? input.readability);
  const roundingLoad = roundingUncertainty(input.readability);
  const repeatability = input.repeatabilitySd ?? 0;
  const eccentricity = input.eccentricity
    ? eccentricityUncertainty(input.eccentricity.maxAbsDeviation, input.eccentricity.load, input.indication)
    : 0;
  const weight = input.testWeight;
  const testWeight = weight === undefined ? 0 : "expandedUncertainty" in weight ? weight.expandedUncertainty / 2 : weight.classMpe / Math.sqrt(3);
  const combined = Math.hypot(roundingZero, roundingLoad, repeatability, eccentricity, testWeight);
  return { roundingZero, roundingLoad, repeatability, eccentricity, testWeight, combined, expanded: k * combined, coverageFactor: k };
}
