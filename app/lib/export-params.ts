import { z } from "zod";
import { CHECK_TYPES } from "../../db/schema/enums";

const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

/** The export's filters: the same ones the tables use, in the URL of the page and of the CSV. */
export const ExportParamsSchema = z.object({
  site: z.preprocess(blank, z.coerce.number().int().positive().optional()),
  instrument: z.preprocess(blank, z.string().trim().max(40).optional()),
  type: z.preprocess(blank, z.enum(CHECK_TYPES).optional()),
  outcome: z.preprocess(blank, z.enum(["in_tolerance", "guard_band", "out_of_tolerance"]).optional()),
  from: z.preprocess(blank, z.iso.date({ error: "From is a date (YYYY-MM-DD)." }).optional()),
  to: z.preprocess(blank, z.iso.date({ error: "To is a date (YYYY-MM-DD)." }).optional()),
  signals: z.preprocess(blank, z.enum(["1"]).optional()),
  bom: z.preprocess(blank, z.enum(["1"]).optional()),
});
export type ExportParams = z.infer<typeof ExportParamsSchema>;

/** A file name that says what was filtered, e.g. checks_AVP_sensitivity_2026-01-01_to_2026-06-30.csv. */
export function exportFileName(params: ExportParams, siteCode: string | null): string {
  const parts = ["checks", siteCode ?? "all-sites", params.instrument, params.type, params.outcome, params.signals ? "with-signals" : undefined, params.from ? `from-${params.from}` : undefined, params.to ? `to-${params.to}` : undefined];
  return `${parts.filter(Boolean).join("_").replace(/[^A-Za-z0-9_.-]/g, "-")}.csv`;
}
