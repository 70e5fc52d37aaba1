// The instrument register's form: one schema for the browser (Conform) and the action.
import { z } from "zod";
import { ACCURACY_CLASSES, INSTRUMENT_KINDS, MASS_UNITS } from "../../db/schema/enums";
import { classConsistencyWarning } from "./stats/oiml-r76";
import { isDecimal, toGrams } from "./units";

const positiveDecimal = (label: string) =>
  z
    .string({ error: `${label} is required.` })
    .trim()
    .refine(isDecimal, `${label} must be a number such as 220 or 0.0001.`)
    .refine((v) => !isDecimal(v) || Number(v) > 0, `${label} must be greater than zero.`);

export const LEGAL_CLASS_NONE = "none";

export const InstrumentFormSchema = z
  .object({
    assetTag: z.string({ error: "Asset tag is required." }).trim().min(2, "Asset tag needs at least 2 characters.").max(40).regex(/^[A-Za-z0-9._-]+$/, "Use letters, digits, dot, dash or underscore."),
    siteId: z.coerce.number({ error: "Choose a site." }).int().positive("Choose a site."),
    roomId: z.coerce.number().int().positive().optional(),
    kind: z.enum(INSTRUMENT_KINDS, { error: "Choose the kind of instrument." }),
    description: z.string().trim().max(200).default(""),
    serialNumber: z.string().trim().max(80).default(""),
    unit: z.enum(MASS_UNITS, { error: "Choose the unit Max, d and e are given in." }),
    capacity: positiveDecimal("Max"),
    readability: positiveDecimal("d"),
    verificationInterval: positiveDecimal("e"),
    accuracyClass: z.enum([...ACCURACY_CLASSES, LEGAL_CLASS_NONE], { error: "Choose a class, or not a legal-metrology instrument." }),
    smallestNetWeight: z.string().trim().optional().refine((v) => !v || isDecimal(v), "Smallest net weight must be a number."),
    smallestNetWeightUnit: z.enum(MASS_UNITS).default("g"),
    riskLevel: z.enum(["low", "medium", "high"]).default("medium"),
  })
  .superRefine((form, ctx) => {
    if (![form.capacity, form.readability, form.verificationInterval].every(isDecimal)) return;
    const max = Number(form.capacity);
    const d = Number(form.readability);
    const e = Number(form.verificationInterval);
    if (d > e) ctx.addIssue({ code: "custom", path: ["readability"], message: "d must not exceed e (the verification interval)." });
    if (e > max) ctx.addIssue({ code: "custom", path: ["verificationInterval"], message: "e must not exceed Max." });
    if (form.accuracyClass !== LEGAL_CLASS_NONE) {
      const mismatch = classConsistencyWarning(form.accuracyClass, Number(toGrams(form.verificationInterval, form.unit)), Number(toGrams(form.capacity, form.unit)));
      if (mismatch) {
        ctx.addIssue({ code: "custom", path: ["accuracyClass"], message: `${mismatch} Or choose "Not a legal-metrology instrument".` });
      }
    }
    if (form.smallestNetWeight && isDecimal(form.smallestNetWeight)) {
      const net = Number(toGrams(form.smallestNetWeight, form.smallestNetWeightUnit));
      if (net <= 0) ctx.addIssue({ code: "custom", path: ["smallestNetWeight"], message: "Smallest net weight must be greater than zero." });
      else if (net > Number(toGrams(form.capacity, form.unit))) ctx.addIssue({ code: "custom", path: ["smallestNetWeight"], message: "Smallest net weight cannot exceed Max." });
    }
  });

export type InstrumentForm = z.infer<typeof InstrumentFormSchema>;

/** The columns an accepted form writes, masses converted exactly to grams. */
export function instrumentValues(form: InstrumentForm) {
  return {
    assetTag: form.assetTag,
    siteId: form.siteId,
    roomId: form.roomId ?? null,
    kind: form.kind,
    description: form.description,
    serialNumber: form.serialNumber,
    displayUnit: form.unit,
    capacityG: toGrams(form.capacity, form.unit),
    readabilityG: toGrams(form.readability, form.unit),
    verificationIntervalG: toGrams(form.verificationInterval, form.unit),
    accuracyClass: form.accuracyClass === LEGAL_CLASS_NONE ? null : form.accuracyClass,
    smallestNetWeightG: form.smallestNetWeight ? toGrams(form.smallestNetWeight, form.smallestNetWeightUnit) : null,
    riskLevel: form.riskLevel,
  };
}

export const KIND_LABELS: Record<(typeof INSTRUMENT_KINDS)[number], string> = {
  micro_balance: "Micro balance",
  semi_micro_balance: "Semi-micro balance",
  analytical_balance: "Analytical balance",
  precision_balance: "Precision balance",
  bench_scale: "Bench scale",
  floor_scale: "Floor scale",
};
