import { z } from "zod";
import { INSTRUMENT_KINDS, INSTRUMENT_STATUSES } from "../../db/schema/enums";

const optionalInt = z.preprocess((v) => (v === "" || v === null ? undefined : v), z.coerce.number().int().positive().optional());
const optionalEnum = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess((v) => (v === "" || v === null ? undefined : v), z.enum(values).optional().catch(undefined));

export const INSTRUMENT_SORTS = ["assetTag", "kind", "capacity", "readability", "room", "status", "site"] as const;

/** The instrument register's filters, sort and page as they stand in the URL; bad values fall back to defaults. */
export const InstrumentListParamsSchema = z.object({
  site: optionalInt.catch(undefined),
  room: optionalInt.catch(undefined),
  kind: optionalEnum(INSTRUMENT_KINDS),
  status: optionalEnum(INSTRUMENT_STATUSES),
  q: z.string().trim().max(80).optional().catch(undefined),
  sort: z.enum(INSTRUMENT_SORTS).catch("assetTag").default("assetTag"),
  dir: z.enum(["asc", "desc"]).catch("asc").default("asc"),
  page: z.coerce.number().int().min(1).catch(1).default(1),
  perPage: z.coerce.number().int().min(5).max(200).catch(25).default(25),
});

export type InstrumentListParams = z.infer<typeof InstrumentListParamsSchema>;

export function parseSearchParams<T extends z.ZodType>(schema: T, url: URL | string): z.infer<T> {
  const params = new URL(url).searchParams;
  return schema.parse(Object.fromEntries(params.entries()));
}
