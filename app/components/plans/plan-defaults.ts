import type { CheckPlan, Instrument, TestWeight } from "../../../db/schema";
import type { PlanFormWeight } from "./plan-form";

interface StoredInputs {
  inputs?: { consequence?: string };
  intervalReason?: string;
}

/** The plan form's starting values: an existing plan as it is, or a new one with the trade's defaults. */
export function planDefaults(instrument: Instrument, plan: CheckPlan | null, weightIds: number[], type?: string): Record<string, string | string[] | undefined> {
  const stored = (plan?.riskAssessment ?? null) as StoredInputs | null;
  return {
    checkType: plan?.checkType ?? type ?? "sensitivity",
    consequence: stored?.inputs?.consequence,
    smallestNetWeightG: instrument.smallestNetWeightG ?? undefined,
    processTolerancePercent: instrument.processTolerancePercent ?? undefined,
    intervalDays: plan ? String(plan.intervalDays) : undefined,
    intervalReason: stored?.intervalReason,
    toleranceBasis: plan?.toleranceBasis ?? (type === "eccentricity" && instrument.accuracyClass ? "oiml_r76_in_service" : "usp41"),
    toleranceValue: plan?.toleranceValue ?? undefined,
    guardBandPolicy: plan?.guardBandPolicy ?? "fraction_of_tolerance",
    guardBandPercent: plan ? String(Number((Number(plan.guardBandFraction) * 100).toFixed(2))) : "33.33",
    safetyFactor: plan ? String(Number(plan.safetyFactor)) : "2",
    repetitions: plan?.repetitions ? String(plan.repetitions) : "10",
    weightIds: weightIds.map(String),
  };
}

export function formWeights(weights: TestWeight[], today: string): PlanFormWeight[] {
  return weights.map((w) => ({ id: w.id, identifier: w.identifier, nominalG: w.nominalG, weightClass: w.weightClass, expandedUncertaintyG: w.expandedUncertaintyG, dueOn: w.dueOn, expired: w.dueOn < today }));
}
