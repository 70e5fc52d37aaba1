// The instrument page's writes: release to service, and exclusion or notes on single checks (metrologists).
import { data } from "react-router";
import { z } from "zod";
import { RELEASE_EVENTS } from "./events";
import { db } from "./db.server";
import { forbiddenPage } from "./http.server";
import { can, type Viewer } from "./permissions";
import { annotateCheck } from "../queries/annotations.server";
import { releaseInstrument } from "../queries/instrument-history.server";

const ActionSchema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("release"),
    event: z.enum(RELEASE_EVENTS, { error: "Choose what brought the instrument back: repair, adjustment or calibration." }),
    reason: z.string().trim().min(5, "Say why the instrument may be used again (at least a few words)."),
    conclusion: z.string().trim().min(5, "Record the conclusion of the impact review."),
  }),
  z.object({
    intent: z.enum(["exclude", "include", "annotate"]),
    checkId: z.coerce.number().int().positive(),
    reason: z.string().trim().min(5, "Give a reason of at least a few words; it is kept in the audit trail."),
  }),
]);

export async function handleInstrumentAction(request: Request, viewer: Viewer, instrument: { id: number; siteId: number }) {
  if (!can(viewer, "review_points", instrument.siteId)) throw forbiddenPage("Only a metrologist can release an instrument or exclude a point.");
  const parsed = ActionSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) return data({ errors: parsed.error.issues.map((i) => i.message), done: null }, { status: 400 });
  const input = parsed.data;
  if (input.intent === "release") {
    const event = await releaseInstrument(db(), viewer, { instrumentId: instrument.id, event: input.event, reason: input.reason, conclusion: input.conclusion });
    if (!event) return data({ errors: ["The instrument is not out of service."], done: null }, { status: 409 });
    return { errors: [] as string[], done: "Released to service. The event and the review's conclusion are in the audit trail." };
  }
  const result = await annotateCheck(db(), viewer, { instrumentId: instrument.id, siteId: instrument.siteId, checkId: input.checkId, intent: input.intent, reason: input.reason });
  if (!result.ok) return data({ errors: [result.message], done: null }, { status: 409 });
  const words = { exclude: "Check excluded from the statistics; the limits were recomputed.", include: "Check included in the statistics again.", annotate: "Note added to the check." };
  return { errors: [] as string[], done: words[input.intent] };
}
