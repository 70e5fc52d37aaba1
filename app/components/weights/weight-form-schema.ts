// One schema for the test-weight form in the browser (Conform) and in the action; masses arrive as typed.
import { z } from "zod";
import { MASS_UNITS } from "../../../db/schema/enums";
import { isDecimal } from "~/lib/units";

export const R111_CLASSES = ["E1", "E2", "F1", "F2", "M1", "M2", "M3"] as const;
export const ASTM_CLASSES = ["ASTM 000", "ASTM 00", "ASTM 0", "ASTM 1", "ASTM 2", "ASTM 3", "ASTM 4", "ASTM 5", "ASTM 6", "ASTM 7"] as const;
export const WEIGHT_CLASS_CHOICES = [...R111_CLASSES, ...ASTM_CLASSES] as const;

const decimal = (label: string, allowZero = false) =>
  z
    .string({ error: `${label} is required.` })
    .trim()
    .refine(isDecimal, `${label} must be a number.`)
    .refine((v) => !isDecimal(v) || (allowZero ? Number(v) >= 0 : Number(v) > 0), `${label} must be ${allowZero ? "zero or more" : "greater than zero"}.`);
const isoDate = (label: string) => z.string({ error: `${label} is required.` }).regex(/^\d{4}-\d{2}-\d{2}$/, `${label} must be a date.`);

export const WeightFormSchema = z
  .object({
    identifier: z.string({ error: "Identifier is required." }).trim().min(2, "At least 2 characters.").max(40).regex(/^[A-Za-z0-9._-]+$/, "Use letters, digits, dot, dash or underscore."),
    setLabel: z.string().trim().max(60).default(""),
    siteId: z.coerce.number({ error: "Choose the custodian site." }).int().positive("Choose the custodian site."),
    unit: z.enum(MASS_UNITS).default("g"),
    nominal: decimal("Nominal value"),
    conventionalMass: decimal("Conventional mass"),
    uncertaintyMg: decimal("Expanded uncertainty U", true),
    weightClass: z.enum(WEIGHT_CLASS_CHOICES, { error: "Choose the class printed on the certificate." }),
    certificateNumber: z.string({ error: "Certificate number is required." }).trim().min(2, "Give the certificate number.").max(80),
    calibratedOn: isoDate("Calibration date"),
    dueOn: isoDate("Due date"),
  })
  .superRefine((f, ctx) => {
    if (f.dueOn <= f.calibratedOn) ctx.addIssue({ code: "custom", path: ["dueOn"], message: "The due date must come after the calibration date." });
    if (isDecimal(f.nominal) && isDecimal(f.conventionalMass) && Math.abs(Number(f.conventionalMass) - Number(f.nominal)) > 0.01 * Number(f.nominal)) {
      ctx.addIssue({ code: "custom", path: ["conventionalMass"], message: "The conventional mass is more than 1 % from the nominal value: check the unit and the certificate." });
    }
  });

export type WeightForm = z.infer<typeof WeightFormSchema>;
