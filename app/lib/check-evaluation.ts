// Turns one check's readings into its result, requirement and outcome, by composing the engine.
// Pure: the server calls it on every path (form, API, import) and never trusts a client's number.
import { eccentricity, type EccentricityReadings } from "./stats/eccentricity";
import { repeatability } from "./stats/repeatability";
import { judgeResult, classifyResult, type GuardBandSpec, type Outcome, type ToleranceSpec } from "./stats/requirement";
import { sensitivityError } from "./stats/sensitivity";
import { indicationUncertainty } from "./stats/uncertainty";
import { assessWeightSuitability } from "./stats/weight-suitability";
import { WEIGHT_CLASSES, weightClassMpeGrams, type WeightClass } from "./stats/oiml-r111";
import type { AccuracyClass, CheckType } from "../../db/schema/enums";
import type { ParsedReading } from "./check-readings";

export interface InstrumentSpec {
  readabilityG: number;
  verificationIntervalG: number;
  capacityG: number;
  accuracyClass: AccuracyClass | null;
  smallestNetWeightG: number | null;
}

export interface RequirementSpec {
  basis: "absolute" | "percent_of_load" | "usp41" | "oiml_r76_in_service";
  value: number | null;
  guardBandPolicy: "fraction_of_tolerance" | "expanded_uncertainty" | "none";
  guardBandFraction: number;
  safetyFactor: number;
}

export interface WeightSpec {
  identifier: string;
  nominalG: number;
  conventionalMassG: number;
  expandedUncertaintyG: number;
  weightClass: string;
  dueOn: string;
}

export interface CheckEvaluation {
  resultG: number;
  toleranceG: number;
  acceptanceG: number;
  outcome: Outcome;
  expandedUncertaintyG: number | null;
  basis: string;
  details: Record<string, number | string | boolean | null>;
}

export type EvaluationOutcome = { ok: true; evaluation: CheckEvaluation } | { ok: false; problems: string[] };

const asWeightClass = (c: string): WeightClass | undefined => (WEIGHT_CLASSES as readonly string[]).includes(c) ? (c as WeightClass) : undefined;

function toleranceSpec(requirement: RequirementSpec, instrument: InstrumentSpec): ToleranceSpec | string {
  switch (requirement.basis) {
    case "absolute":
      return requirement.value && requirement.value > 0 ? { kind: "absolute", grams: requirement.value } : "The plan's absolute tolerance is missing.";
    case "percent_of_load":
      return requirement.value && requirement.value > 0 ? { kind: "percent-of-load", percent: requirement.value } : "The plan's tolerance in percent is missing.";
    case "usp41":
      return { kind: "usp-41" };
    case "oiml_r76_in_service":
      return instrument.accuracyClass
        ? { kind: "oiml-r76-in-service", accuracyClass: instrument.accuracyClass, e: instrument.verificationIntervalG }
        : "The plan asks for the OIML R 76 in-service mpe, but the instrument has no accuracy class.";
  }
}

const BASIS_WORDS = { absolute: "absolute tolerance", percent_of_load: "percent of the load", usp41: "USP <41> 0.10 %", oiml_r76_in_service: "OIML R 76 in-service mpe" };

function weightUncertainty(weight: WeightSpec) {
  if (weight.expandedUncertaintyG > 0) return { expandedUncertainty: weight.expandedUncertaintyG };
  const cls = asWeightClass(weight.weightClass);
  const mpe = cls ? weightClassMpeGrams(cls, weight.nominalG) : null;
  return mpe === null ? undefined : { classMpe: mpe };
}

function guardSpec(requirement: RequirementSpec, expandedUncertainty: number | null): GuardBandSpec {
  if (requirement.guardBandPolicy === "none") return { kind: "fraction", fraction: 0 };
  if (requirement.guardBandPolicy === "expanded_uncertainty" && expandedUncertainty !== null) return { kind: "uncertainty", expandedUncertainty };
  return { kind: "fraction", fraction: requirement.guardBandFraction };
}

function weightProblems(weight: WeightSpec | null, tolerance: number, checkDate: string): string[] {
  if (!weight) return ["This check needs a test weight."];
  const cls = asWeightClass(weight.weightClass);
  const verdict = assessWeightSuitability(
    { nominalGrams: weight.nominalG, weightClass: cls, expandedUncertainty: weight.expandedUncertaintyG, certificateDueDate: weight.dueOn },
    tolerance,
    checkDate,
  );
  return verdict.problems.map((p) => `Weight ${weight.identifier}: ${p}`);
}

/** Result, tolerance, acceptance and outcome of one check (all g); refuses with reasons instead of guessing. */
export function evaluateCheck(input: {
  type: CheckType;
  instrument: InstrumentSpec;
  requirement: RequirementSpec;
  weight: WeightSpec | null;
  readings: ParsedReading[];
  checkDate: string;
}): EvaluationOutcome {
  const { type, instrument, requirement, weight, readings } = input;
  const d = instrument.readabilityG;

  if (type === "repeatability") {
    const rep = repeatability(readings.map((r) => r.grams), d);
    // USP <41>: 2·s/m ≤ 0.10 % at the smallest net weight m, i.e. s ≤ m/2000; the safety factor narrows it to the acceptance limit.
    const tolerance = requirement.basis === "absolute" && requirement.value ? requirement.value : instrument.smallestNetWeightG ? instrument.smallestNetWeightG / 2000 : null;
    if (tolerance === null) return { ok: false, problems: ["Record the smallest net weight used on this instrument, or give the plan an absolute limit for s."] };
    const acceptance = tolerance / Math.max(1, requirement.safetyFactor);
    return {
      ok: true,
      evaluation: {
        resultG: rep.sEffective,
        toleranceG: tolerance,
        acceptanceG: acceptance,
        outcome: classifyResult(rep.sEffective, tolerance, acceptance),
        expandedUncertaintyG: null,
        basis: requirement.basis === "absolute" ? "absolute limit for s" : "USP <41> minimum weight with safety factor",
        details: { n: rep.n, mean: rep.mean, s: rep.s, sEffective: rep.sEffective, floored: rep.floored, minimumWeightG: rep.minimumWeight, safetyFactor: requirement.safetyFactor },
      },
    };
  }

  if (!weight) return { ok: false, problems: ["This check needs a test weight."] };
  const spec = toleranceSpec(requirement, instrument);
  if (typeof spec === "string") return { ok: false, problems: [spec] };
  const load = weight.conventionalMassG;

  if (type === "sensitivity") {
    const indication = readings.reduce((sum, r) => sum + r.grams, 0) / readings.length;
    const { error, relativeError } = sensitivityError(indication, load);
    const budget = indicationUncertainty({ readability: d, indication, testWeight: weightUncertainty(weight) });
    const judgement = judgeResult(error, load, spec, guardSpec(requirement, budget.expanded));
    const problems = weightProblems(weight, judgement.tolerance, input.checkDate);
    if (problems.length) return { ok: false, problems };
    return {
      ok: true,
      evaluation: {
        resultG: error,
        toleranceG: judgement.tolerance,
        acceptanceG: judgement.acceptance,
        outcome: judgement.outcome,
        expandedUncertaintyG: budget.expanded,
        basis: BASIS_WORDS[requirement.basis],
        details: { indicationG: indication, referenceMassG: load, relativeError, readings: readings.length },
      },
    };
  }

  const byPosition = Object.fromEntries(readings.map((r) => [r.position, r.grams]));
  const ecc = eccentricity({
    centre: byPosition.centre,
    frontLeft: byPosition["front-left"],
    backLeft: byPosition["back-left"],
    backRight: byPosition["back-right"],
    frontRight: byPosition["front-right"],
  } satisfies EccentricityReadings);
  // Each ΔI is a difference of two readings, so rounding enters twice; the weight cancels out of a difference.
  const budget = indicationUncertainty({ readability: d, indication: byPosition.centre });
  const judgement = judgeResult(ecc.maxAbsDeviation, load, spec, guardSpec(requirement, budget.expanded));
  // ΔI is a difference of two readings of the same load, so the weight's mass error cancels: only its certificate must be current.
  if (weight.dueOn < input.checkDate) return { ok: false, problems: [`Weight ${weight.identifier}: its certificate was due on ${weight.dueOn}, before the check date ${input.checkDate}.`] };
  return {
    ok: true,
    evaluation: {
      resultG: ecc.maxAbsDeviation,
      toleranceG: judgement.tolerance,
      acceptanceG: judgement.acceptance,
      outcome: judgement.outcome,
      expandedUncertaintyG: budget.expanded,
      basis: BASIS_WORDS[requirement.basis],
      details: { worstPosition: ecc.worstPosition, loadG: load, ...Object.fromEntries(Object.entries(ecc.deviations).map(([k, v]) => [`delta_${k}`, v])) },
    },
  };
}
