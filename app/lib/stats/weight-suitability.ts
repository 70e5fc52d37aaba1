import { weightClassMpeGrams, type WeightClass } from "./oiml-r111";
import { parseIsoInstant } from "./time-axis";

/** USP <41>: the weight's mpe or calibration uncertainty is not more than one third of the test limit. */
export const WEIGHT_TO_TOLERANCE_RATIO = 1 / 3;

export interface TestWeight {
  nominalGrams: number;
  weightClass?: WeightClass;
  /** Expanded uncertainty U (k = 2) from the certificate, g. */
  expandedUncertainty?: number;
  /** Date the certificate runs out (ISO 8601 date). */
  certificateDueDate?: string;
}

export interface WeightSuitability {
  suitable: boolean;
  /** T/3, g. */
  limit: number;
  classMpe: number | null;
  problems: string[];
}

/** Whether a test weight may serve a check with tolerance T (g) on `checkDate` (ISO date): class mpe (R 111 Table 1) and certificate U each ≤ T/3 (USP <41>), certificate due on or after the check date; problems as sentences. */
export function assessWeightSuitability(weight: TestWeight, tolerance: number, checkDate: string): WeightSuitability {
  const limit = tolerance * WEIGHT_TO_TOLERANCE_RATIO;
  const problems: string[] = [];
  const classMpe = weight.weightClass ? weightClassMpeGrams(weight.weightClass, weight.nominalGrams) : null;
  if (weight.weightClass && classMpe === null) {
    problems.push(`OIML R 111 lists no ${weight.weightClass} mpe for a ${weight.nominalGrams} g weight.`);
  }
  if (classMpe !== null && classMpe > limit) {
    problems.push(`The ${weight.weightClass} class mpe (${milligrams(classMpe)}) is more than one third of the tolerance (${milligrams(limit)}).`);
  }
  if (weight.expandedUncertainty !== undefined && weight.expandedUncertainty > limit) {
    problems.push(`The certificate uncertainty (${milligrams(weight.expandedUncertainty)}) is more than one third of the tolerance (${milligrams(limit)}).`);
  }
  if (!weight.weightClass && weight.expandedUncertainty === undefined) {
    problems.push("Neither a weight class nor a certificate uncertainty is recorded, so suitability cannot be shown.");
  }
  if (weight.certificateDueDate === undefined) {
    problems.push("No certificate due date is recorded.");
  } else if (!(parseIsoInstant(weight.certificateDueDate.slice(0, 10)) >= parseIsoInstant(checkDate.slice(0, 10)))) {
    problems.push(`The weight's certificate was due on ${weight.certificateDueDate.slice(0, 10)}, before the check date ${checkDate.slice(0, 10)}.`);
  }
  return { suitable: problems.length === 0, limit, classMpe, problems };
}

function milligrams(grams: number): string {
  return `${Number((grams * 1000).toPrecision(3))} mg`;
}
