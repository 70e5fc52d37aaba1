// What the printable records show: one check with its requirement and history, or an instrument over a period.
import { aliasedTable, and, asc, desc, eq, gte, inArray, lt } from "drizzle-orm";
import { auditEvents, checkPlans, checkPlanWeights, checkReadings, checks, impactReviews, instrumentEvents, intervalReviewDecisions, pointAnnotations, seriesSummaries, testWeights, users } from "../../db/schema";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import type { DbOrTx } from "../lib/db.server";
import { notFoundPage } from "../lib/http.server";
import type { Viewer } from "../lib/permissions";
import { getInstrumentPage } from "./instruments.server";

export async function getCheckRecord(db: DbOrTx, viewer: Viewer, checkId: number) {
  const [row] = Number.isSafeInteger(checkId) && checkId > 0 ? await db.select({ check: checks, operator: users.name }).from(checks).innerJoin(users, eq(users.id, checks.operatorId)).where(eq(checks.id, checkId)) : [];
  if (!row) throw notFoundPage("No such check.");
  const instrument = await getInstrumentPage(db, viewer, row.check.instrumentId);
  const [readings, [plan], [weight], [supersededBy], annotations, events] = await Promise.all([
    db.select().from(checkReadings).where(eq(checkReadings.checkId, checkId)).orderBy(asc(checkReadings.ordinal)),
    row.check.planId ? db.select().from(checkPlans).where(eq(checkPlans.id, row.check.planId)) : Promise.resolve([]),
    row.check.weightId ? db.select().from(testWeights).where(eq(testWeights.id, row.check.weightId)) : Promise.resolve([]),
    db.select({ id: checks.id, reason: checks.correctionReason }).from(checks).where(eq(checks.correctsCheckId, checkId)),
    db.select({ a: pointAnnotations, by: users.name }).from(pointAnnotations).innerJoin(users, eq(users.id, pointAnnotations.createdById)).where(eq(pointAnnotations.checkId, checkId)).orderBy(asc(pointAnnotations.createdAt)),
    db.select({ e: auditEvents, by: users.name }).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId)).where(and(eq(auditEvents.entityType, "check"), eq(auditEvents.entityId, String(checkId)))).orderBy(asc(auditEvents.at)),
  ]);
  return { ...row, instrument, readings, plan: plan ?? null, weight: weight ?? null, supersededBy: supersededBy ?? null, annotations, events };
}

const reviewer = aliasedTable(users, "reviewer");

export async function getInstrumentHistory(db: DbOrTx, viewer: Viewer, instrumentId: number, period: { from: Date; to: Date }) {
  const instrument = await getInstrumentPage(db, viewer, instrumentId);
  const inPeriod = (column: AnyPgColumn) => and(gte(column, period.from), lt(column, period.to));
  const plans = await db.select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId)).orderBy(asc(checkPlans.checkType));
  const [planWeights, checkRows, eventRows, exclusions, decisions, summaries, reviews, releases] = await Promise.all([
    plans.length ? db.select({ planId: checkPlanWeights.planId, identifier: testWeights.identifier }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId)).where(inArray(checkPlanWeights.planId, plans.map((p) => p.id))) : Promise.resolve([]),
    db.select({ c: checks, operator: users.name, weight: testWeights.identifier }).from(checks).innerJoin(users, eq(users.id, checks.operatorId)).leftJoin(testWeights, eq(testWeights.id, checks.weightId)).where(and(eq(checks.instrumentId, instrumentId), inPeriod(checks.performedAt))).orderBy(asc(checks.performedAt), asc(checks.id)),
    db.select({ e: instrumentEvents, by: users.name }).from(instrumentEvents).leftJoin(users, eq(users.id, instrumentEvents.createdById)).where(and(eq(instrumentEvents.instrumentId, instrumentId), inPeriod(instrumentEvents.occurredAt))).orderBy(asc(instrumentEvents.occurredAt)),
    db.select({ a: pointAnnotations, by: users.name, performedAt: checks.performedAt, type: checks.checkType }).from(pointAnnotations).innerJoin(checks, eq(checks.id, pointAnnotations.checkId)).innerJoin(users, eq(users.id, pointAnnotations.createdById)).where(and(eq(checks.instrumentId, instrumentId), inPeriod(pointAnnotations.createdAt))).orderBy(asc(pointAnnotations.createdAt)),
    plans.length ? db.select({ d: intervalReviewDecisions, by: users.name }).from(intervalReviewDecisions).innerJoin(users, eq(users.id, intervalReviewDecisions.decidedById)).where(and(inArray(intervalReviewDecisions.planId, plans.map((p) => p.id)), inPeriod(intervalReviewDecisions.decidedAt))).orderBy(asc(intervalReviewDecisions.decidedAt)) : Promise.resolve([]),
    db.select().from(seriesSummaries).where(eq(seriesSummaries.instrumentId, instrumentId)),
    db.select({ r: impactReviews, closedBy: reviewer.name }).from(impactReviews).leftJoin(reviewer, eq(reviewer.id, impactReviews.closedById)).where(and(eq(impactReviews.instrumentId, instrumentId), inPeriod(impactReviews.openedAt))).orderBy(asc(impactReviews.openedAt)),
    db.select({ e: auditEvents, by: users.name }).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId)).where(and(eq(auditEvents.entityType, "instrument"), eq(auditEvents.entityId, String(instrumentId)), inPeriod(auditEvents.at))).orderBy(desc(auditEvents.at)).limit(200),
  ]);
  return { instrument, plans: plans.map((p) => ({ ...p, weights: planWeights.filter((w) => w.planId === p.id).map((w) => w.identifier) })), checks: checkRows, events: eventRows, exclusions, decisions, summaries, reviews, instrumentEvents: releases };
}
