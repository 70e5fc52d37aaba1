import { z } from "zod";
import { CHECK_TYPES } from "../../db/schema/enums";

const blank = (v: unknown) => (v === "" ? undefined : v);

/** The instrument page's checks table in the URL (prefixed with c so it sits beside the chart's own view). */
export const CheckTableParamsSchema = z.object({
  ctype: z.preprocess(blank, z.enum(CHECK_TYPES).optional()).catch(undefined),
  coutcome: z.preprocess(blank, z.enum(["in_tolerance", "guard_band", "out_of_tolerance"]).optional()).catch(undefined),
  csort: z.enum(["performedAt", "result", "outcome", "type"]).catch("performedAt").default("performedAt"),
  cdir: z.enum(["asc", "desc"]).catch("desc").default("desc"),
  cpage: z.coerce.number().int().min(1).catch(1).default(1),
  cper: z.coerce.number().int().min(5).max(100).catch(15).default(15),
});
export type CheckTableParams = z.infer<typeof CheckTableParamsSchema>;
