// What a judged check sets in motion, inside the check's own transaction; mail goes out after commit.
import { and, count, desc, eq, gt, inArray, ne } from "drizzle-orm";
import { checks, impactReviews, instruments, memberships, notifications, users } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { Outcome } from "../lib/stats/requirement";
import type { DbOrTx } from "../lib/db.server";
import { writeAudit } from "./audit.server";

const DAY = 86_400_000;

export interface Consequences {
  instrumentStatus: "in_service" | "out_of_service" | "retired";
  impactReviewId: number | null;
  notificationIds: number[];
}

async function recipients(db: DbOrTx, instrument: typeof instruments.$inferSelect) {
  const rows = await db
    .select({ id: users.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.siteId, instrument.siteId), eq(memberships.role, "metrologist"), eq(users.active, true)));
  return [...new Set([...rows.map((r) => r.id), ...(instrument.ownerId ? [instrument.ownerId] : [])])];
}

/** One notification per person and episode: an episode key already used is not notified again. */
async function notifyOnce(db: DbOrTx, userIds: number[], note: { kind: string; subject: string; body: string; instrumentId: number; episodeKey: string }) {
  if (!userIds.length) return [];
  const already = await db.select({ userId: notifications.userId }).from(notifications).where(and(inArray(notifications.userId, userIds), eq(notifications.episodeKey, note.episodeKey)));
  const fresh = userIds.filter((id) => !already.some((a) => a.userId === id));
  if (!fresh.length) return [];
  const rows = await db.insert(notifications).values(fresh.map((userId) => ({ userId, ...note }))).returning({ id: notifications.id });
  return rows.map((r) => r.id);
}

export async function applyConsequences(
  db: DbOrTx,
  params: { instrument: typeof instruments.$inferSelect; checkId: number; type: CheckType; outcome: Outcome; performedAt: Date; resultText: string; actorId: number },
): Promise<Consequences> {
  const { instrument, checkId, type, outcome, performedAt } = params;
  const people = await recipients(db, instrument);
  if (outcome === "in_tolerance") return { instrumentStatus: instrument.status, impactReviewId: null, notificationIds: [] };

  if (outcome === "guard_band") {
    // The episode lasts until the next check within acceptance: key it on the last in-tolerance check before this one.
    const [lastGood] = await db.select({ id: checks.id }).from(checks).where(and(eq(checks.instrumentId, instrument.id), eq(checks.checkType, type), eq(checks.outcome, "in_tolerance"))).orderBy(desc(checks.performedAt)).limit(1);
    const ids = await notifyOnce(db, people, {
      kind: "guard_band",
      subject: `${instrument.assetTag}: ${type} check in the guard band`,
      body: `The ${type} check of ${instrument.assetTag} on ${performedAt.toISOString()} gave ${params.resultText}, inside the tolerance but beyond the acceptance limit. The instrument stays in service; watch its trend.`,
      instrumentId: instrument.id,
      episodeKey: `guard_band:${instrument.id}:${type}:${lastGood?.id ?? 0}`,
    });
    return { instrumentStatus: instrument.status, impactReviewId: null, notificationIds: ids };
  }

  await db.update(instruments).set({ status: "out_of_service", updatedAt: new Date() }).where(eq(instruments.id, instrument.id));
  await writeAudit(db, { actorId: params.actorId, action: "instrument.out_of_service", entityType: "instrument", entityId: String(instrument.id), siteId: instrument.siteId, before: { status: instrument.status }, after: { status: "out_of_service", checkId } });
  const [lastPassing] = await db
    .select({ at: checks.performedAt })
    .from(checks)
    .where(and(eq(checks.instrumentId, instrument.id), eq(checks.checkType, type), ne(checks.outcome, "out_of_tolerance"), ne(checks.id, checkId)))
    .orderBy(desc(checks.performedAt))
    .limit(1);
  const since = lastPassing?.at ?? null;
  const [{ checksSince }] = await db
    .select({ checksSince: count() })
    .from(checks)
    .where(and(eq(checks.instrumentId, instrument.id), since ? gt(checks.performedAt, since) : undefined));
  const daysOfUse = since ? Math.max(1, Math.ceil((performedAt.getTime() - since.getTime()) / DAY)) : 0;
  const [review] = await db.insert(impactReviews).values({ instrumentId: instrument.id, failedCheckId: checkId, checkType: type, lastPassingAt: since, checksSince, daysOfUse }).returning();
  await writeAudit(db, { actorId: params.actorId, action: "impact_review.open", entityType: "impact_review", entityId: String(review.id), siteId: instrument.siteId, after: review });
  const ids = await notifyOnce(db, people, {
    kind: "out_of_tolerance",
    subject: `${instrument.assetTag} is out of service: ${type} check out of tolerance`,
    body: [
      `The ${type} check of ${instrument.assetTag} on ${performedAt.toISOString()} gave ${params.resultText}, outside the tolerance.`,
      "The instrument has been taken out of service. Do not use it until a metrologist releases it after a repair, adjustment or calibration.",
      since ? `An impact review is open for the ${daysOfUse} day(s) of use and ${checksSince} check(s) since the last passing check on ${since.toISOString()}.` : "An impact review is open; no earlier passing check of this type is recorded.",
      "Assess the weighings made since then under your site's quality system.",
    ].join("\n\n"),
    instrumentId: instrument.id,
    episodeKey: `out_of_tolerance:${instrument.id}:${checkId}`,
  });
  return { instrumentStatus: "out_of_service", impactReviewId: review.id, notificationIds: ids };
}

/** Sends queued notifications by mail and marks them sent; a mail failure leaves them queued for a retry. */
export async function deliverNotifications(db: DbOrTx, ids: number[], send: (m: { to: string[]; subject: string; text: string }) => Promise<void>) {
  if (!ids.length) return;
  const rows = await db.select({ id: notifications.id, subject: notifications.subject, body: notifications.body, email: users.email }).from(notifications).innerJoin(users, eq(users.id, notifications.userId)).where(inArray(notifications.id, ids));
  for (const row of rows) {
    try {
      await send({ to: [row.email], subject: row.subject, text: row.body });
      await db.update(notifications).set({ sentAt: new Date() }).where(eq(notifications.id, row.id));
    } catch (error) {
      console.error(`Notification ${row.id} not sent yet:`, error instanceof Error ? error.message : error);
    }
  }
}
