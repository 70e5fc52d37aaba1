// The JSON body of POST /api/v1/checks, validated before anything is looked up.
import { z } from "zod";
import { CHECK_TYPES, MASS_UNITS } from "../../db/schema/enums";
import type { Problem } from "./domain-errors";

const reading = z.union([z.number(), z.string()]);

export const CheckRequestSchema = z.object({
  instrument: z.string({ error: "Give the instrument's asset tag." }).trim().min(1, "Give the instrument's asset tag."),
  type: z.enum(CHECK_TYPES, { error: `type is one of ${CHECK_TYPES.join(", ")}.` }),
  performedAt: z.iso.datetime({ offset: true, error: "performedAt is an ISO 8601 time with an offset, e.g. 2026-11-30T07:45:00+01:00." }),
  unit: z.enum(MASS_UNITS, { error: `unit is one of ${MASS_UNITS.join(", ")}.` }),
  weight: z.string().trim().min(1).optional(),
  readings: z.union([z.array(reading).min(1).max(100), z.record(z.string(), reading)], { error: "readings is a list of numbers, or an object of the five eccentricity positions." }),
  note: z.string().max(2000).optional(),
});

export type CheckRequest = z.infer<typeof CheckRequestSchema>;

export function parseCheckRequest(body: unknown): { ok: true; value: CheckRequest } | { ok: false; problems: Problem[] } {
  const parsed = CheckRequestSchema.safeParse(body);
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, problems: parsed.error.issues.map((i) => ({ pointer: `/${i.path.join("/")}`, message: i.message })) };
}
