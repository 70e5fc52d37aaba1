import { z } from "zod";
import { CHECK_TYPES } from "../../db/schema/enums";

export const RANGE_PRESETS = ["90d", "1y", "all", "custom"] as const;
export type RangePreset = (typeof RANGE_PRESETS)[number];

const date = z.preprocess((v) => (v === "" ? undefined : v), z.iso.date().optional());

/** The drift study's view as it stands in the URL: check type and time range. */
export const SeriesParamsSchema = z.object({
  type: z.enum(CHECK_TYPES).catch("sensitivity").default("sensitivity"),
  range: z.enum(RANGE_PRESETS).catch("1y").default("1y"),
  from: date.catch(undefined),
  to: date.catch(undefined),
});
export type SeriesParams = z.infer<typeof SeriesParamsSchema>;

const DAY = 86_400_000;

/** The [from, to) instants a view covers; `to` is the end of the chosen day, `now` for presets. */
export function rangeBounds(params: Pick<SeriesParams, "range" | "from" | "to">, now: Date): { from: Date | null; to: Date } {
  if (params.range === "custom") {
    return { from: params.from ? new Date(`${params.from}T00:00:00Z`) : null, to: params.to ? new Date(Date.parse(`${params.to}T00:00:00Z`) + DAY) : now };
  }
  if (params.range === "all") return { from: null, to: now };
  return { from: new Date(now.getTime() - (params.range === "90d" ? 90 : 365) * DAY), to: now };
}
