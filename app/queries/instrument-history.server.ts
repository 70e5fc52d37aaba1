import { and, desc, eq, isNull } from "drizzle-orm";
import { checks, impactReviews, instrumentEvents, instruments, testWeights, users } from "../../db/schema";
import type { Database, DbOrTx } from "../lib/db.server";
import type { ReleaseEvent } from "../lib/events";
import type { Viewer } from "../lib/permissions";
import { writeAudit } from "./audit.server";

export async function recentChecks(db: DbOrTx, instrumentId: number, limit = 20) {
  return db
    .select({ id: checks.id, type: checks.checkType, performedAt: checks.performedAt, outcome: checks.outcome, resultG: checks.resultG, toleranceG: checks.toleranceG, acceptanceG: checks.acceptanceG, operator: users.name, weight: testWeights.identifier, source: checks.source })
    .from(checks)
    .innerJoin(users, eq(users.id, checks.operatorId))
    .leftJoin(testWeights, eq(testWeights.id, checks.weightId))
    .where(eq(checks.instrumentId, instrumentId))
    .orderBy(desc(checks.performedAt), desc(checks.id))
    .limit(limit);
}

export async function openImpactReview(db: DbOrTx, instrumentId: number) {
  const [review] = await db.select().from(impactReviews).where(and(eq(impactReviews.instrumentId, instrumentId), isNull(impactReviews.closedAt))).orderBy(desc(impactReviews.openedAt)).limit(1);
  return review ?? null;
}


/** Back to service after a failure: the event that fixed it, the impact review's conclusion, both audited. */
export async function releaseInstrument(db: Database, actor: Viewer, params: { instrumentId: number; event: ReleaseEvent; reason: string; conclusion: string }) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(instruments).where(eq(instruments.id, params.instrumentId)).for("update");
    if (before.status !== "out_of_service") return null;
    const now = new Date();
    const [event] = await tx.insert(instrumentEvents).values({ instrumentId: before.id, kind: params.event, occurredAt: now, note: params.reason, createdById: actor.id }).returning();
    await tx.update(instruments).set({ status: "in_service", updatedAt: now }).where(eq(instruments.id, before.id));
    const review = await openImpactReview(tx, before.id);
    if (review) await tx.update(impactReviews).set({ closedAt: now, closedById: actor.id, conclusion: params.conclusion }).where(eq(impactReviews.id, review.id));
    await writeAudit(tx, {
      actorId: actor.id,
      action: "instrument.release",
      entityType: "instrument",
      entityId: String(before.id),
      siteId: before.siteId,
      before: { status: before.status, impactReview: review ? { id: review.id, closedAt: null } : null },
      after: { status: "in_service", reason: params.reason, eventId: event.id, event: params.event, impactReview: review ? { id: review.id, conclusion: params.conclusion } : null },
    });
    return event;
  });
}
