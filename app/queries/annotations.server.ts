// Excluding a point from the statistics, or noting something on it: never deletes, always audited, reversible.
import { and, eq, isNull } from "drizzle-orm";
import { checks, pointAnnotations } from "../../db/schema";
import type { Database } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";
import { writeAudit } from "./audit.server";
import { refreshSeriesSummary } from "./series-summary.server";

export type AnnotationIntent = "exclude" | "include" | "annotate";

export async function annotateCheck(db: Database, actor: Viewer, params: { instrumentId: number; siteId: number; checkId: number; intent: AnnotationIntent; reason: string }) {
  return db.transaction(async (tx) => {
    const [check] = await tx.select().from(checks).where(and(eq(checks.id, params.checkId), eq(checks.instrumentId, params.instrumentId)));
    if (!check) return { ok: false as const, message: "That check does not belong to this instrument." };
    const active = await tx.select().from(pointAnnotations).where(and(eq(pointAnnotations.checkId, check.id), eq(pointAnnotations.excluded, true), isNull(pointAnnotations.withdrawnAt)));
    if (params.intent === "exclude" && active.length) return { ok: false as const, message: "This check is already excluded." };
    if (params.intent === "include" && !active.length) return { ok: false as const, message: "This check is not excluded." };
    const before = { excluded: active.length > 0 };
    if (params.intent === "include") {
      await tx.update(pointAnnotations).set({ withdrawnAt: new Date() }).where(eq(pointAnnotations.id, active[0].id));
      await tx.insert(pointAnnotations).values({ checkId: check.id, excluded: false, reason: `Included again: ${params.reason}`, createdById: actor.id });
    } else {
      await tx.insert(pointAnnotations).values({ checkId: check.id, excluded: params.intent === "exclude", reason: params.reason, createdById: actor.id });
    }
    const after = { excluded: params.intent === "exclude" ? true : params.intent === "include" ? false : before.excluded, reason: params.reason };
    await writeAudit(tx, { actorId: actor.id, action: `check.${params.intent}`, entityType: "check", entityId: String(check.id), siteId: params.siteId, before, after });
    if (params.intent !== "annotate") await refreshSeriesSummary(tx, check.instrumentId, check.checkType, new Date());
    return { ok: true as const };
  });
}
