export const ECCENTRICITY_POSITIONS = ["frontLeft", "backLeft", "backRight", "frontRight"] as const;
export type OffCentrePosition = (typeof ECCENTRICITY_POSITIONS)[number];

export interface EccentricityReadings {
  centre: number;
  frontLeft: number;
  backLeft: number;
  backRight: number;
  frontRight: number;
}

export interface EccentricityResult {
  /** ΔIᵢ = Iᵢ − I_centre per off-centre position, g. */
  deviations: Record<OffCentrePosition, number>;
  /** max |ΔIᵢ|, g. */
  maxAbsDeviation: number;
  /** Position of the largest |ΔIᵢ|; the first in the order front-left, back-left, back-right, front-right on ties. */
  worstPosition: OffCentrePosition;
}

/** Eccentricity ΔIᵢ = Iᵢ − I_centre (g) for the four off-centre positions and max |ΔIᵢ|; ties keep the earlier position; all equal gives 0. */
export function eccentricity(readings: EccentricityReadings): EccentricityResult {
  let worstPosition: OffCentrePosition = "frontLeft";
  let maxAbsDeviation = -1;
  const deviations = {} as Record<OffCentrePosition, number>;
  for (const position of ECCENTRICITY_POSITIONS) {
    const deviation = readings[position] - readings.centre;
    deviations[position] = deviation;
    if (Math.abs(deviation) > maxAbsDeviation) {
      maxAbsDeviation = Math.abs(deviation);
      worstPosition = position;
    }
  }
  return { deviations, maxAbsDeviation, worstPosition };
}
