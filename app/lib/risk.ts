// Tareline's risk model for routine checks (docs/decisions/006-risk-model-for-check-plans.md): the consequence of a
// wrong result × how tight the process is against what the instrument can do. Pure; it suggests, it never applies.
import type { AccuracyClass } from "./stats/oiml-r76";
import { inServiceMpe } from "./stats/oiml-r76";
import { ROUNDING_SD_FACTOR } from "./stats/limits";
import { minimumWeight } from "./stats/repeatability";

export const CONSEQUENCES = ["patient_safety", "product_release", "internal_use"] as const;
export type Consequence = (typeof CONSEQUENCES)[number];

export const CONSEQUENCE_LABELS: Record<Consequence, string> = {
  patient_safety: "Patient or consumer safety",
  product_release: "Product release or a reported result",
  internal_use: "Internal use only",
};

const CONSEQUENCE_SCORE: Record<Consequence, number> = { patient_safety: 3, product_release: 2, internal_use: 1 };

export type RiskBand = "high" | "medium" | "low";
export type PlannedCheck = "sensitivity" | "repeatability" | "eccentricity";

/** Intervals in days per band; a missing entry means the band does not call for that check type. */
export const SUGGESTED_INTERVALS: Record<RiskBand, Partial<Record<PlannedCheck, number>>> = {
  high: { sensitivity: 1, repeatability: 7, eccentricity: 30 },
  medium: { sensitivity: 7, repeatability: 30, eccentricity: 90 },
  low: { sensitivity: 30, repeatability: 90 },
};

export interface RiskInput {
  consequence: Consequence;
  /** The smallest net weight the process weighs on the instrument, g. */
  smallestNetWeightG: number | null;
  /** The process tolerance, percent of the weighed quantity. */
  processTolerancePercent: number | null;
  readabilityG: number;
  verificationIntervalG: number;
  accuracyClass: AccuracyClass | null;
  /** The latest minimum weight from a repeatability check, g; null before the first one. */
  measuredMinimumWeightG: number | null;
  safetyFactor: number;
}

export interface RiskAssessment {
  version: 1;
  inputs: RiskInput;
  consequenceScore: number;
  tightnessScore: number;
  score: number;
  band: RiskBand;
  suggestedIntervals: Partial<Record<PlannedCheck, number>>;
  reasoning: string[];
  /** True when the smallest net weight is below SF × minimum weight: no interval makes the instrument fit. */
  unfit: boolean;
}

const round = (n: number) => Number(n.toPrecision(3));
const mg = (g: number) => (g < 1 ? `${round(g * 1000)} mg` : `${round(g)} g`);

function minimumWeightTightness(input: RiskInput, reasons: string[]): { score: number; unfit: boolean } {
  if (input.smallestNetWeightG === null) {
    reasons.push("No smallest net weight is recorded, so the margin over the minimum weight cannot be judged: treated as tight.");
    return { score: 3, unfit: false };
  }
  // USP <41>: the lowest minimum weight any balance of readability d can show is 2000 × 0.41 d = 820 d.
  const measured = input.measuredMinimumWeightG;
  const mMin = measured ?? minimumWeight(ROUNDING_SD_FACTOR * input.readabilityG);
  const source = measured === null ? `the best a balance with d = ${mg(input.readabilityG)} can do, 820 d by USP <41>, as no repeatability check is recorded yet` : "from the latest repeatability check";
  const margin = input.smallestNetWeightG / (input.safetyFactor * mMin);
  const words = `The smallest net weight ${mg(input.smallestNetWeightG)} is ${round(margin)} × (safety factor ${input.safetyFactor} × minimum weight ${mg(mMin)}, ${source})`;
  if (margin < 1) {
    reasons.push(`${words}: the instrument cannot weigh it to 0.10 %. Use a finer instrument or a larger quantity; more frequent checks do not fix this.`);
    return { score: 3, unfit: true };
  }
  if (margin < 3) return reasons.push(`${words}: a tight margin.`), { score: 3, unfit: false };
  if (margin < 10) return reasons.push(`${words}: a moderate margin.`), { score: 2, unfit: false };
  reasons.push(`${words}: an ample margin.`);
  return { score: 1, unfit: false };
}

function toleranceTightness(input: RiskInput, reasons: string[]): number | null {
  if (input.processTolerancePercent === null || input.smallestNetWeightG === null) {
    reasons.push("No process tolerance is recorded, so it is not compared with the instrument's error limit.");
    return null;
  }
  const tolerance = (input.processTolerancePercent / 100) * input.smallestNetWeightG;
  const [limit, name] = input.accuracyClass
    ? [inServiceMpe(input.accuracyClass, input.verificationIntervalG, input.smallestNetWeightG), `the OIML R 76 in-service mpe (class ${input.accuracyClass})`]
    : [input.readabilityG, "the readability d (no accuracy class)"];
  const ratio = tolerance / limit;
  const words = `The process tolerance ${input.processTolerancePercent} % at ${mg(input.smallestNetWeightG)} is ${mg(tolerance)}, ${round(ratio)} × ${name} of ${mg(limit)}`;
  if (ratio < 2) return reasons.push(`${words}: tight.`), 3;
  if (ratio < 10) return reasons.push(`${words}: moderate.`), 2;
  reasons.push(`${words}: ample.`);
  return 1;
}

/** Score = consequence (1–3) × tightness (1–3, the worse of minimum-weight margin and tolerance/mpe); ≥ 6 high, ≥ 3 medium, else low. */
export function assessRisk(input: RiskInput): RiskAssessment {
  const reasoning: string[] = [];
  const consequenceScore = CONSEQUENCE_SCORE[input.consequence];
  reasoning.push(`A wrong result affects: ${CONSEQUENCE_LABELS[input.consequence].toLowerCase()} (consequence ${consequenceScore} of 3).`);
  const minimum = minimumWeightTightness(input, reasoning);
  const tolerance = toleranceTightness(input, reasoning);
  const tightnessScore = Math.max(minimum.score, tolerance ?? 1);
  const score = consequenceScore * tightnessScore;
  const band: RiskBand = score >= 6 ? "high" : score >= 3 ? "medium" : "low";
  const suggestedIntervals = SUGGESTED_INTERVALS[band];
  const list = Object.entries(suggestedIntervals).map(([type, days]) => `${type} every ${days === 1 ? "day" : `${days} days`}`);
  reasoning.push(`Consequence ${consequenceScore} × tightness ${tightnessScore} = ${score} of 9: ${band} risk, so ${list.join(", ")}.`);
  if (!("eccentricity" in suggestedIntervals)) reasoning.push("At low risk an eccentricity check adds little between calibrations; add one if loads sit off-centre.");
  return { version: 1, inputs: input, consequenceScore, tightnessScore, score, band, suggestedIntervals, reasoning, unfit: minimum.unfit };
}

/** The interval an approved review leads to: extend × 1.5 (at most 365 days), shorten ÷ 2 (at least 1 day), keep unchanged. */
export function proposedIntervalDays(recommendation: "extend" | "keep" | "shorten", current: number): number {
  if (recommendation === "extend") return Math.min(365, Math.max(current + 1, Math.round(current * 1.5)));
  if (recommendation === "shorten") return Math.max(1, Math.floor(current / 2));
  return current;
}
