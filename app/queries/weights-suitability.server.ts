// Whether a test weight may serve a plan, in the same terms the check itself is judged in: class mpe (OIML R 111
// Table 1) and certificate U each ≤ T/3 (USP <41>) at the weight's own load, certificate current, not heavier than Max.
import type { CheckPlan, Instrument, TestWeight } from "../../db/schema";
import { WEIGHT_CLASSES, weightClassMpeGrams, type WeightClass } from "../lib/stats/oiml-r111";
import { toleranceLimit, type ToleranceSpec } from "../lib/stats/requirement";
import { assessWeightSuitability, WEIGHT_TO_TOLERANCE_RATIO } from "../lib/stats/weight-suitability";

export const ASTM_E617_CLASSES = ["000", "00", "0", "1", "2", "3", "4", "5", "6", "7"] as const;

export interface PlanSuitability {
  suitable: boolean;
  /** The tolerance T at the weight's load and T/3, g; null where the check does not depend on the weight's accuracy. */
  toleranceG: number | null;
  limitG: number | null;
  classMpeG: number | null;
  uncertaintyG: number;
  problems: string[];
  notes: string[];
}

export const asR111Class = (c: string): WeightClass | undefined => ((WEIGHT_CLASSES as readonly string[]).includes(c) ? (c as WeightClass) : undefined);
export const isAstmClass = (c: string) => /^ASTM\s/i.test(c) && (ASTM_E617_CLASSES as readonly string[]).includes(c.replace(/^ASTM\s+/i, ""));

type PlanRequirement = Pick<CheckPlan, "checkType" | "toleranceBasis" | "toleranceValue">;
type InstrumentLimits = Pick<Instrument, "capacityG" | "accuracyClass" | "verificationIntervalG">;

function toleranceSpec(plan: PlanRequirement, instrument: InstrumentLimits): ToleranceSpec | string {
  const value = plan.toleranceValue === null ? null : Number(plan.toleranceValue);
  switch (plan.toleranceBasis) {
    case "absolute":
      return value && value > 0 ? { kind: "absolute", grams: value } : "The plan has no absolute tolerance.";
    case "percent_of_load":
      return value && value > 0 ? { kind: "percent-of-load", percent: value } : "The plan has no tolerance in percent.";
    case "usp41":
      return { kind: "usp-41" };
    case "oiml_r76_in_service":
      return instrument.accuracyClass
        ? { kind: "oiml-r76-in-service", accuracyClass: instrument.accuracyClass, e: Number(instrument.verificationIntervalG) }
        : "The plan uses the OIML R 76 in-service mpe, but the instrument has no accuracy class.";
  }
}

/** The verdict for one weight against one plan on `onDate` (YYYY-MM-DD), with every problem in words. */
export function suitabilityForPlan(plan: PlanRequirement, instrument: InstrumentLimits, weight: Pick<TestWeight, "identifier" | "nominalG" | "conventionalMassG" | "weightClass" | "expandedUncertaintyG" | "dueOn">, onDate: string): PlanSuitability {
  const nominal = Number(weight.nominalG);
  const load = Number(weight.conventionalMassG);
  const uncertaintyG = Number(weight.expandedUncertaintyG);
  const r111 = asR111Class(weight.weightClass);
  const notes: string[] = [];
  const problems: string[] = [];
  if (nominal > Number(instrument.capacityG)) problems.push(`It is heavier than the instrument's Max (${instrument.capacityG} g).`);
  if (!r111) notes.push(isAstmClass(weight.weightClass) ? "ASTM E617 class: Tareline holds no ASTM tolerance table, so only the certificate uncertainty is compared with T/3." : `Class "${weight.weightClass}" is not an OIML R 111 class: only the certificate uncertainty is compared with T/3.`);

  if (plan.checkType !== "sensitivity") {
    notes.push(plan.checkType === "repeatability" ? "A repeatability load need not be calibrated (USP <41>); only its certificate date is shown." : "An eccentricity result is a difference of readings, so the weight's own error cancels; only its certificate date counts.");
    const verdict = assessWeightSuitability({ nominalGrams: nominal, certificateDueDate: weight.dueOn }, Number.POSITIVE_INFINITY, onDate);
    const dateProblems = verdict.problems.filter((p) => /due/.test(p) && !/Neither/.test(p));
    if (plan.checkType === "eccentricity") problems.push(...dateProblems);
    else notes.push(...dateProblems);
    return { suitable: problems.length === 0, toleranceG: null, limitG: null, classMpeG: r111 ? weightClassMpeGrams(r111, nominal) : null, uncertaintyG, problems, notes };
  }

  const spec = toleranceSpec(plan, instrument);
  if (typeof spec === "string") return { suitable: false, toleranceG: null, limitG: null, classMpeG: null, uncertaintyG, problems: [...problems, spec], notes };
  const toleranceG = toleranceLimit(spec, load);
  const verdict = assessWeightSuitability({ nominalGrams: nominal, weightClass: r111, expandedUncertainty: uncertaintyG, certificateDueDate: weight.dueOn }, toleranceG, onDate);
  problems.push(...verdict.problems);
  return { suitable: problems.length === 0, toleranceG, limitG: toleranceG * WEIGHT_TO_TOLERANCE_RATIO, classMpeG: verdict.classMpe, uncertaintyG, problems, notes };
}
