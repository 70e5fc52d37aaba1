// One schema for the plan form in the browser (Conform) and in the action.
import { z } from "zod";
import { CHECK_TYPES } from "../../../db/schema/enums";
import { CONSEQUENCES } from "~/lib/risk";
import { isDecimal } from "~/lib/units";

export const TOLERANCE_BASES = ["absolute", "percent_of_load", "usp41", "oiml_r76_in_service"] as const;
export const GUARD_BAND_POLICIES = ["fraction_of_tolerance", "expanded_uncertainty", "none"] as const;

export const TOLERANCE_BASIS_LABELS: Record<(typeof TOLERANCE_BASES)[number], string> = {
  absolute: "Absolute (g)",
  percent_of_load: "Percent of the load",
  usp41: "USP <41>: 0.10 % of the load",
  oiml_r76_in_service: "OIML R 76 in-service mpe",
};
export const GUARD_BAND_LABELS: Record<(typeof GUARD_BAND_POLICIES)[number], string> = {
  fraction_of_tolerance: "A fraction of T",
  expanded_uncertainty: "The check's expanded uncertainty U (k = 2)",
  none: "No guard band (A = T)",
};

const optionalDecimal = (label: string) =>
  z.preprocess((v) => (v === "" ? undefined : v), z.string().trim().refine(isDecimal, `${label} must be a number.`).refine((v) => Number(v) > 0, `${label} must be greater than zero.`).optional());

export const PlanFormSchema = z
  .object({
    checkType: z.enum(CHECK_TYPES, { error: "Choose the check type." }),
    consequence: z.enum(CONSEQUENCES, { error: "Say what a wrong result would affect." }),
    smallestNetWeightG: optionalDecimal("Smallest net weight"),
    processTolerancePercent: optionalDecimal("Process tolerance"),
    intervalDays: z.coerce.number({ error: "Give the interval in days." }).int("Whole days only.").min(1, "At least 1 day.").max(730, "At most 730 days."),
    intervalReason: z.string().trim().max(500).default(""),
    toleranceBasis: z.enum(TOLERANCE_BASES, { error: "Choose the tolerance basis." }),
    toleranceValue: optionalDecimal("Tolerance"),
    guardBandPolicy: z.enum(GUARD_BAND_POLICIES).default("fraction_of_tolerance"),
    guardBandPercent: z.coerce.number().min(0, "0 % or more.").max(100, "At most 100 % of T.").default(33.3),
    safetyFactor: z.coerce.number({ error: "Give the safety factor." }).min(1, "The safety factor is at least 1.").max(10, "At most 10.").default(2),
    repetitions: z.preprocess((v) => (v === "" ? undefined : v), z.coerce.number().int().min(2, "At least 2 repetitions.").max(30, "At most 30.").optional()),
    weightIds: z.array(z.coerce.number().int().positive()).default([]),
  })
  .superRefine((form, ctx) => {
    if ((form.toleranceBasis === "absolute" || form.toleranceBasis === "percent_of_load") && !form.toleranceValue) {
      ctx.addIssue({ code: "custom", path: ["toleranceValue"], message: form.toleranceBasis === "absolute" ? "Give the tolerance in grams." : "Give the tolerance in percent of the load." });
    }
    if (form.checkType !== "repeatability" && form.weightIds.length === 0) ctx.addIssue({ code: "custom", path: ["weightIds"], message: "Assign at least one test weight." });
  });

export type PlanForm = z.infer<typeof PlanFormSchema>;
