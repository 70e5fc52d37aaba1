export interface SensitivityResult {
  /** E = I − m_ref, in grams. */
  error: number;
  /** e = E/m_ref (dimensionless; × 100 for percent). */
  relativeError: number;
}

/** Sensitivity error E = I − m_ref (g) and e = E/m_ref of an indication I against the weight's conventional mass; e is NaN when m_ref = 0. */
export function sensitivityError(indication: number, referenceMass: number): SensitivityResult {
  const error = indication - referenceMass;
  return { error, relativeError: referenceMass === 0 ? Number.NaN : error / referenceMass };
}
