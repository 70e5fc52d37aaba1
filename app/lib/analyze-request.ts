import { z } from "zod";
import type { AnalyzeSeriesInput } from "~/lib/stats/analyze";
import { RULE_IDS } from "~/lib/stats/run-rules";
import { parseIsoInstant } from "~/lib/stats/time-axis";

export const MAX_ANALYZE_VALUES = 100_000;

const finite = (what: string) => z.number({ error: `${what} must be a finite number` });
const positive = (what: string) => finite(what).gt(0, { error: `${what} must be greater than 0` });

const BaselineSchema = z.union([
  z.strictObject({ count: z.int({ error: "Baseline count must be a whole number" }).min(1).max(MAX_ANALYZE_VALUES) }),
  z.strictObject({ center: finite("Baseline centre"), sigma: positive("Baseline sigma") }),
], { error: "Baseline is either { count } or { center, sigma }" });

const RulesSchema = z.union([
  z.enum(["nelson", "western-electric", "none"]),
  z.array(z.enum(RULE_IDS, { error: `Unknown rule id; use one of ${RULE_IDS.join(", ")}` })).max(RULE_IDS.length * 2),
], { error: `Rules are "nelson", "western-electric", "none" or a list of rule ids` });

const ToleranceSchema = z
  .strictObject({
    upper: finite("Upper tolerance").optional(),
    lower: finite("Lower tolerance").optional(),
    guardBand: finite("Guard band").min(0, { error: "Guard band must not be negative" }).optional(),
  })
  .superRefine((t, ctx) => {
    if (t.upper === undefined && t.lower === undefined) ctx.addIssue({ code: "custom", message: "Give an upper or a lower tolerance limit, or both" });
    if (t.upper !== undefined && t.lower !== undefined && !(t.lower < t.upper)) {
      ctx.addIssue({ code: "custom", path: ["lower"], message: "Lower tolerance must be below the upper one" });
    }
  });

export const AnalyzeRequestSchema = z
  .strictObject({
    values: z
      .array(finite("Each value"), { error: "values must be an array of numbers" })
      .min(1, { error: "Give at least one value" })
      .max(MAX_ANALYZE_VALUES, { error: `At most ${MAX_ANALYZE_VALUES} values per request` }),
    times: z
      .array(z.string().refine((t) => !Number.isNaN(parseIsoInstant(t)), { error: "Use an ISO 8601 date, or a date-time with Z or an offset" }))
      .optional(),
    resolution: positive("Resolution").optional(),
    baseline: BaselineSchema.optional(),
    rules: RulesSchema.optional(),
    ewma: z
      .union([z.literal(false), z.strictObject({ lambda: finite("λ").gt(0, { error: "λ must be above 0" }).lte(1, { error: "λ must be at most 1" }), L: positive("L") })])
      .optional(),
    cusum: z.union([z.literal(false), z.strictObject({ k: finite("k").min(0, { error: "k must not be negative" }), h: positive("h") })]).optional(),
    tolerance: ToleranceSchema.optional(),
    forecastHorizon: positive("Forecast horizon").max(36_500).optional(),
  })
  .superRefine((body, ctx) => {
    const { times, values } = body;
    if (!times) return;
    if (times.length !== values.length) {
      ctx.addIssue({ code: "custom", path: ["times"], message: `times has ${times.length} entries for ${values.length} values` });
      return;
    }
    for (let i = 1; i < times.length; i++) {
      if (parseIsoInstant(times[i]) < parseIsoInstant(times[i - 1])) {
        ctx.addIssue({ code: "custom", path: ["times", i], message: "Times must not decrease" });
        return;
      }
    }
  });

export type AnalyzeRequest = z.infer<typeof AnalyzeRequestSchema>;

export interface RequestProblem {
  /** JSON pointer (RFC 6901) to the offending member, "" for the body itself. */
  pointer: string;
  message: string;
}

export type ParseAnalyzeResult = { ok: true; value: AnalyzeSeriesInput } | { ok: false; problems: RequestProblem[] };

/** Validates a JSON body for the analysis endpoint; problems carry JSON pointers such as "/values/3". */
export function parseAnalyzeRequest(body: unknown): ParseAnalyzeResult {
  const result = AnalyzeRequestSchema.safeParse(body);
  if (result.success) return { ok: true, value: result.data };
  return { ok: false, problems: result.error.issues.flatMap((issue) => toProblems(issue, [])) };
}

/** A union's own issue says little; report the branch that got past the type check, where there is one. */
function toProblems(issue: z.core.$ZodIssue, prefix: readonly PropertyKey[]): RequestProblem[] {
  const path = [...prefix, ...issue.path];
  if (issue.code === "invalid_union") {
    const matched = issue.errors.find((branch) => branch.length > 0 && branch.every((inner) => inner.path.length > 0));
    if (matched) return matched.flatMap((inner) => toProblems(inner, path));
  }
  return [{ pointer: toPointer(path), message: issue.message }];
}

function toPointer(path: readonly PropertyKey[]): string {
  return path.map((part) => `/${String(part).replaceAll("~", "~0").replaceAll("/", "~1")}`).join("");
}
