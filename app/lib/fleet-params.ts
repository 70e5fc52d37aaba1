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
  page: z.coerce.number().int().positive().catch(1).default(1),
});
export type FleetParams = z.infer<typeof FleetParamsSchema>;

/** Instruments per page of the fleet view; the per-site comparison always covers them all. */
export const FLEET_PAGE_SIZE = 50;

/** The page of an already sorted list, with the page number clamped to the last page. */
export function fleetPage<T>(rows: T[], page: number) {
  const pages = Math.max(1, Math.ceil(rows.length / FLEET_PAGE_SIZE));
  const current = Math.min(page, pages);
  return { rows: rows.slice((current - 1) * FLEET_PAGE_SIZE, current * FLEET_PAGE_SIZE), page: current, pages, total: rows.length };
}
