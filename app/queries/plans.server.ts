// Check plans: the requirement, interval, weights and risk reasoning per instrument × check type, every change audited.
import { and, asc, desc, eq, inArray, isNull, ne, sql } from "drizzle-orm";
import { checkPlans, checkPlanWeights, checks, instruments, intervalReviewDecisions, seriesSummaries, testWeights, users } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { PlanForm } from "../components/plans/plan-form-schema";
import type { Database, DbOrTx } from "../lib/db.server";
import { notFoundPage } from "../lib/http.server";
import type { Viewer } from "../lib/permissions";
import { assessRisk, proposedIntervalDays, type RiskAssessment } from "../lib/risk";
import type { IntervalReview } from "../lib/stats/interval-review";
import { writeAudit } from "./audit.server";
import { getInstrumentPage } from "./instruments.server";
import { suitabilityForPlan } from "./weights-suitability.server";

export type InstrumentRow = typeof instruments.$inferSelect;

/** The risk assessment as stored with a plan: the engine-free model's output plus who assessed it and what was chosen. */
export interface StoredRiskAssessment extends RiskAssessment {
  assessedAt: string;
  assessedBy: string;
  chosenIntervalDays: number;
  intervalReason: string;
}

export async function instrumentRow(db: DbOrTx, viewer: Viewer, id: number) {
  const visible = await getInstrumentPage(db, viewer, id);
  const [row] = await db.select().from(instruments).where(eq(instruments.id, visible.id));
  return { visible, row };
}

/** The minimum weight (g) of the latest valid repeatability check, or null before the first. */
export async function measuredMinimumWeight(db: DbOrTx, instrumentId: number): Promise<number | null> {
  const [last] = await db
    .select({ details: checks.details })
    .from(checks)
    .where(and(eq(checks.instrumentId, instrumentId), eq(checks.checkType, "repeatability"), isNull(checks.supersededAt), ne(checks.outcome, "out_of_tolerance")))
    .orderBy(desc(checks.performedAt))
    .limit(1);
  const value = last?.details?.minimumWeightG;
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

export async function siteWeights(db: DbOrTx, siteId: number) {
  return db.select().from(testWeights).where(eq(testWeights.siteId, siteId)).orderBy(asc(testWeights.nominalG), asc(testWeights.identifier));
}

export async function plansOfInstrument(db: DbOrTx, instrumentId: number) {
  return db.select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId)).orderBy(asc(checkPlans.checkType));
}

export function riskFor(form: Pick<PlanForm, "consequence" | "smallestNetWeightG" | "processTolerancePercent" | "safetyFactor">, instrument: InstrumentRow, measuredMinimumWeightG: number | null): RiskAssessment {
  return assessRisk({
    consequence: form.consequence,
    smallestNetWeightG: form.smallestNetWeightG ? Number(form.smallestNetWeightG) : null,
    processTolerancePercent: form.processTolerancePercent ? Number(form.processTolerancePercent) : null,
    readabilityG: Number(instrument.readabilityG),
    verificationIntervalG: Number(instrument.verificationIntervalG),
    accuracyClass: instrument.accuracyClass,
    measuredMinimumWeightG,
    safetyFactor: form.safetyFactor,
  });
}

export type SavePlanResult = { ok: true; planId: number } | { ok: false; fieldErrors: Record<string, string[]>; formErrors?: string[] };

const sameDecimal = (a: string | null, b: string | null) => (a === null || b === null ? a === b : Number(a) === Number(b));

/** Creates or updates a plan with its weights; refuses weights that may not serve it. The instrument's smallest net weight and process tolerance are saved with it. */
export async function savePlan(db: Database, actor: Viewer, params: { instrument: InstrumentRow; planId: number | null; form: PlanForm; today: string }): Promise<SavePlanResult> {
  const { instrument, form } = params;
  return db.transaction(async (tx): Promise<SavePlanResult> => {
    const [locked] = await tx.select().from(instruments).where(eq(instruments.id, instrument.id)).for("update");
    const existing = params.planId ? (await tx.select().from(checkPlans).where(and(eq(checkPlans.id, params.planId), eq(checkPlans.instrumentId, instrument.id))).for("update"))[0] : undefined;
    if (params.planId && !existing) throw notFoundPage("No such plan on this instrument.");
    const checkType: CheckType = existing?.checkType ?? form.checkType;
    if (!existing) {
      const [clash] = await tx.select({ id: checkPlans.id }).from(checkPlans).where(and(eq(checkPlans.instrumentId, instrument.id), eq(checkPlans.checkType, checkType)));
      if (clash) return { ok: false, fieldErrors: { checkType: [`${locked.assetTag} already has a ${checkType} plan: open it to change it.`] } };
    }
    const chosen = form.weightIds.length ? await tx.select().from(testWeights).where(inArray(testWeights.id, form.weightIds)) : [];
    const requirement = { checkType, toleranceBasis: form.toleranceBasis, toleranceValue: form.toleranceValue ?? null };
    const weightErrors: string[] = [];
    for (const w of chosen) {
      if (w.siteId !== locked.siteId) weightErrors.push(`${w.identifier} is kept at another site.`);
      const verdict = suitabilityForPlan(requirement, locked, w, params.today);
      if (!verdict.suitable) weightErrors.push(`${w.identifier} may not serve this plan: ${verdict.problems.join(" ")}`);
    }
    if (chosen.length !== form.weightIds.length) weightErrors.push("A chosen weight no longer exists.");
    if (weightErrors.length) return { ok: false, fieldErrors: { weightIds: weightErrors } };

    const risk = riskFor(form, locked, await measuredMinimumWeight(tx, locked.id));
    const stored: StoredRiskAssessment = { ...risk, assessedAt: new Date().toISOString(), assessedBy: actor.name, chosenIntervalDays: form.intervalDays, intervalReason: form.intervalReason };
    const values = {
      intervalDays: form.intervalDays,
      toleranceBasis: form.toleranceBasis,
      toleranceValue: form.toleranceBasis === "absolute" || form.toleranceBasis === "percent_of_load" ? form.toleranceValue! : null,
      guardBandPolicy: form.guardBandPolicy,
      guardBandFraction: (form.guardBandPercent / 100).toFixed(10),
      safetyFactor: String(form.safetyFactor),
      repetitions: checkType === "repeatability" ? (form.repetitions ?? 10) : null,
      riskAssessment: stored,
    };
    const beforeWeights = existing ? await weightIdentifiers(tx, existing.id) : [];
    const [plan] = existing
      ? await tx.update(checkPlans).set(values).where(eq(checkPlans.id, existing.id)).returning()
      : await tx.insert(checkPlans).values({ ...values, instrumentId: locked.id, checkType }).returning();
    await tx.delete(checkPlanWeights).where(eq(checkPlanWeights.planId, plan.id));
    if (chosen.length) await tx.insert(checkPlanWeights).values(chosen.map((w) => ({ planId: plan.id, weightId: w.id })));
    await writeAudit(tx, {
      actorId: actor.id,
      action: existing ? "plan.update" : "plan.create",
      entityType: "plan",
      entityId: String(plan.id),
      siteId: locked.siteId,
      before: existing ? { ...existing, weights: beforeWeights } : null,
      after: { ...plan, weights: chosen.map((w) => w.identifier) },
    });
    const smallest = form.smallestNetWeightG ?? null;
    const processTolerance = form.processTolerancePercent ?? null;
    if (!sameDecimal(smallest, locked.smallestNetWeightG) || !sameDecimal(processTolerance, locked.processTolerancePercent)) {
      await tx.update(instruments).set({ smallestNetWeightG: smallest, processTolerancePercent: processTolerance, updatedAt: new Date() }).where(eq(instruments.id, locked.id));
      await writeAudit(tx, {
        actorId: actor.id,
        action: "instrument.update",
        entityType: "instrument",
        entityId: String(locked.id),
        siteId: locked.siteId,
        before: { smallestNetWeightG: locked.smallestNetWeightG, processTolerancePercent: locked.processTolerancePercent },
        after: { smallestNetWeightG: smallest, processTolerancePercent: processTolerance, via: `plan ${plan.id}` },
      });
    }
    return { ok: true, planId: plan.id };
  });
}

async function weightIdentifiers(db: DbOrTx, planId: number) {
  const rows = await db.select({ identifier: testWeights.identifier }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId)).where(eq(checkPlanWeights.planId, planId));
  return rows.map((r) => r.identifier).sort();
}

/** A plan with its instrument (a plan at another site is a 404), weights, the engine's review and the decisions on it. */
export async function getPlan(db: DbOrTx, viewer: Viewer, planId: number) {
  if (!Number.isSafeInteger(planId) || planId <= 0) throw notFoundPage("No such plan.");
  const [plan] = await db.select().from(checkPlans).where(eq(checkPlans.id, planId));
  if (!plan) throw notFoundPage("No such plan.");
  const { visible, row } = await instrumentRow(db, viewer, plan.instrumentId);
  const weights = await db.select({ weight: testWeights }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId)).where(eq(checkPlanWeights.planId, plan.id)).orderBy(asc(testWeights.nominalG));
  const [summary] = await db.select().from(seriesSummaries).where(and(eq(seriesSummaries.instrumentId, plan.instrumentId), eq(seriesSummaries.checkType, plan.checkType)));
  const decisions = await db
    .select({ decision: intervalReviewDecisions, by: users.name })
    .from(intervalReviewDecisions)
    .innerJoin(users, eq(users.id, intervalReviewDecisions.decidedById))
    .where(eq(intervalReviewDecisions.planId, plan.id))
    .orderBy(desc(intervalReviewDecisions.decidedAt));
  return { plan, instrument: visible, instrumentRow: row, weights: weights.map((w) => w.weight), summary: summary ?? null, review: (summary?.review ?? null) as IntervalReview | null, decisions };
}

export class StaleReview extends Error {}

/** A metrologist's decision on the engine's interval review; approval changes the interval. Both are audited. */
export async function decideIntervalReview(db: Database, actor: Viewer, params: { planId: number; siteId: number; recommendation: string; decision: "approved" | "rejected"; comment: string }) {
  return db.transaction(async (tx) => {
    const [plan] = await tx.select().from(checkPlans).where(eq(checkPlans.id, params.planId)).for("update");
    const [summary] = await tx.select({ review: seriesSummaries.review }).from(seriesSummaries).where(and(eq(seriesSummaries.instrumentId, plan.instrumentId), eq(seriesSummaries.checkType, plan.checkType)));
    const review = summary?.review as IntervalReview | null | undefined;
    if (!review || review.recommendation !== params.recommendation) throw new StaleReview("The engine's review changed since the page was opened. Read the new one before deciding.");
    const proposed = proposedIntervalDays(review.recommendation, plan.intervalDays);
    const [decision] = await tx
      .insert(intervalReviewDecisions)
      .values({ planId: plan.id, recommendation: review.recommendation, reason: review.reason, previousIntervalDays: plan.intervalDays, proposedIntervalDays: proposed, decision: params.decision, comment: params.comment, decidedById: actor.id })
      .returning();
    const changes = params.decision === "approved" && proposed !== plan.intervalDays;
    if (changes) await tx.update(checkPlans).set({ intervalDays: proposed }).where(eq(checkPlans.id, plan.id));
    await writeAudit(tx, {
      actorId: actor.id,
      action: params.decision === "approved" ? "plan.interval_review.approve" : "plan.interval_review.reject",
      entityType: "plan",
      entityId: String(plan.id),
      siteId: params.siteId,
      before: { intervalDays: plan.intervalDays },
      after: { intervalDays: changes ? proposed : plan.intervalDays, recommendation: review.recommendation, reason: review.reason, comment: params.comment, decisionId: decision.id },
    });
    return decision;
  });
}

/** Applies the stored risk assessment's interval for this plan's check type, only when a metrologist asks for it. */
export async function applyRiskSuggestion(db: Database, actor: Viewer, params: { planId: number; siteId: number }) {
  return db.transaction(async (tx) => {
    const [plan] = await tx.select().from(checkPlans).where(eq(checkPlans.id, params.planId)).for("update");
    const risk = plan.riskAssessment as StoredRiskAssessment | null;
    const suggested = risk?.suggestedIntervals?.[plan.checkType];
    if (!suggested) return null;
    const [after] = await tx.update(checkPlans).set({ intervalDays: suggested, riskAssessment: { ...risk, chosenIntervalDays: suggested, intervalReason: "Suggested interval applied." } }).where(eq(checkPlans.id, plan.id)).returning();
    await writeAudit(tx, { actorId: actor.id, action: "plan.apply_risk_suggestion", entityType: "plan", entityId: String(plan.id), siteId: params.siteId, before: { intervalDays: plan.intervalDays }, after: { intervalDays: after.intervalDays, band: risk?.band } });
    return after;
  });
}

/** Every plan at the viewer's sites, for the programme overview. */
export async function listPlanRows(db: DbOrTx, planIds: number[]) {
  if (!planIds.length) return [];
  return db
    .select({ id: checkPlans.id, toleranceBasis: checkPlans.toleranceBasis, riskBand: sql<string | null>`${checkPlans.riskAssessment}->>'band'`, review: seriesSummaries.review, weights: sql<number>`(select count(*)::int from ${checkPlanWeights} where ${checkPlanWeights.planId} = ${checkPlans.id})` })
    .from(checkPlans)
    .leftJoin(seriesSummaries, and(eq(seriesSummaries.instrumentId, checkPlans.instrumentId), eq(seriesSummaries.checkType, checkPlans.checkType)))
    .where(inArray(checkPlans.id, planIds));
}
