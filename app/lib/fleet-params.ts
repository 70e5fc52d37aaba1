import { z } from "zod";
import { CHECK_TYPES, INSTRUMENT_STATUSES } from "../../db/schema/enums";

const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

export const FLEET_SORTS = ["forecast", "drift", "nextDue", "lastCheck", "assetTag", "status", "signals"] as const;

/** The fleet view's filters and sort, as they stand in the URL and in GET /api/v1/fleet. */
export const FleetParamsSchema = z.object({
  site: z.preprocess(blank, z.coerce.number().int().positive().optional()).catch(undefined),
  type: z.enum(CHECK_TYPES).catch("sensitivity").default("sensitivity"),
  status: z.preprocess(blank, z.enum(INSTRUMENT_STATUSES).optional()).catch(undefined),
  overdue: z.preprocess(blank, z.enum(["1"]).optional()).catch(undefined),
  sort: z.enum(FLEET_SORTS).catch("forecast").default("forecast"),
  dir: z.enum(["asc", "desc"]).catch("asc").default("asc"),
});
export type FleetParams = z.infer<typeof FleetParamsSchema>;
