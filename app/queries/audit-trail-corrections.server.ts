// A correction never overwrites: it is a new check pointing at the original, which keeps its readings and judgement
// and is marked superseded. The engine judges the corrected readings exactly as it judged the first ones.
import { asc, eq } from "drizzle-orm";
import { checkPlans, checkReadings, checks, instruments, testWeights } from "../../db/schema";
import { evaluateCheck } from "../lib/check-evaluation";
import { parseReadings } from "../lib/check-readings";
import type { Database, DbOrTx } from "../lib/db.server";
import { CheckRefused } from "../lib/domain-errors";
import { can, type Viewer } from "../lib/permissions";
import { formatMass } from "../lib/units";
import { writeAudit } from "./audit.server";
import { instrumentSpec, requirementSpec, weightSpec } from "./check-context.server";
import { dedupeKey } from "./checks.server";
import { applyConsequences } from "./consequences.server";
import { getInstrumentPage } from "./instruments.server";
import { refreshSeriesSummary } from "./series-summary.server";
import { readingsEnteredSql } from "./readings-entered.server";

export async function getCheckForCorrection(db: DbOrTx, viewer: Viewer, checkId: number) {
  const [check] = Number.isSafeInteger(checkId) && checkId > 0 ? await db.select().from(checks).where(eq(checks.id, checkId)) : [];
  if (!check) throw new Response("No such check.", { status: 404 });
  const instrument = await getInstrumentPage(db, viewer, check.instrumentId);
  const readings = await db.select().from(checkReadings).where(eq(checkReadings.checkId, check.id)).orderBy(asc(checkReadings.ordinal));
  return { check, instrument, readings, mayCorrect: mayCorrect(viewer, check, instrument.siteId) };
}

/** The person who performed the check (still allowed to record at the site) or a metrologist there. */
export function mayCorrect(viewer: Viewer, check: { operatorId: number }, siteId: number): boolean {
  return can(viewer, "review_points", siteId) || (check.operatorId === viewer.id && can(viewer, "record_check", siteId));
}

export async function correctCheck(db: Database, viewer: Viewer, params: { checkId: number; readings: unknown; reason: string }, now = new Date()) {
  return db.transaction(async (tx) => {
    const [original] = await tx.select().from(checks).where(eq(checks.id, params.checkId)).for("update");
    const [instrument] = await tx.select().from(instruments).where(eq(instruments.id, original.instrumentId)).for("update");
    if (!mayCorrect(viewer, original, instrument.siteId)) throw new CheckRefused(403, [{ pointer: "", message: "Only the person who performed the check or a metrologist may correct it." }]);
    if (original.supersededAt) throw new CheckRefused(409, [{ pointer: "", message: "This check was already corrected; correct the latest version instead." }]);
    if (params.reason.trim().length < 5) throw new CheckRefused(422, [{ pointer: "/reason", message: "Give the reason for the correction (at least a few words)." }]);
    const [plan] = original.planId ? await tx.select().from(checkPlans).where(eq(checkPlans.id, original.planId)) : [];
    if (!plan) throw new CheckRefused(422, [{ pointer: "", message: "The check has no plan to judge it against." }]);
    const [weight] = original.weightId ? await tx.select().from(testWeights).where(eq(testWeights.id, original.weightId)) : [];
    const parsed = parseReadings(params.readings, { type: original.checkType, unit: original.unit, readabilityG: instrument.readabilityG });
    if (!parsed.ok) throw new CheckRefused(422, parsed.problems);
    const checkDate = original.performedAt.toISOString().slice(0, 10);
    const judged = evaluateCheck({ type: original.checkType, instrument: instrumentSpec(instrument), requirement: requirementSpec(plan), weight: weight ? weightSpec(weight) : null, readings: parsed.readings, checkDate });
    if (!judged.ok) throw new CheckRefused(422, judged.problems.map((message) => ({ pointer: "", message })));
    const key = dedupeKey(instrument.id, original.checkType, original.performedAt, original.unit, parsed.readings.map((r) => r.entered));
    if (key === original.dedupeKey) throw new CheckRefused(422, [{ pointer: "", message: "These are the readings already recorded: there is nothing to correct." }]);
    const before = await tx.select({ value: checkReadings.value, position: checkReadings.position }).from(checkReadings).where(eq(checkReadings.checkId, original.id)).orderBy(asc(checkReadings.ordinal));
    const { evaluation } = judged;
    const [row] = await tx
      .insert(checks)
      .values({
        instrumentId: original.instrumentId,
        checkType: original.checkType,
        planId: original.planId,
        weightId: original.weightId,
        operatorId: original.operatorId,
        performedAt: original.performedAt,
        unit: original.unit,
        resultG: evaluation.resultG,
        expandedUncertaintyG: evaluation.expandedUncertaintyG,
        toleranceG: evaluation.toleranceG,
        acceptanceG: evaluation.acceptanceG,
        outcome: evaluation.outcome,
        basis: evaluation.basis,
        details: evaluation.details,
        source: original.source,
        dedupeKey: key,
        note: original.note,
        correctsCheckId: original.id,
        correctionReason: params.reason.trim(),
        readingsEntered: readingsEnteredSql(parsed.readings),
      })
      .returning();
    await tx.insert(checkReadings).values(parsed.readings.map((r, i) => ({ checkId: row.id, ordinal: i + 1, position: r.position, value: r.entered })));
    await tx.update(checks).set({ supersededAt: now }).where(eq(checks.id, original.id));
    await writeAudit(tx, {
      actorId: viewer.id,
      action: "check.correct",
      entityType: "check",
      entityId: String(original.id),
      siteId: instrument.siteId,
      before: { ...original, readings: before.map((b) => b.value) },
      after: { ...row, readings: parsed.readings.map((r) => r.entered), reason: params.reason.trim() },
    });
    const consequences = await applyConsequences(tx, { instrument, checkId: row.id, type: original.checkType, outcome: evaluation.outcome, performedAt: original.performedAt, resultText: formatMass(evaluation.resultG, original.unit, instrument.readabilityG), actorId: viewer.id });
    await refreshSeriesSummary(tx, instrument.id, original.checkType, now);
    return { id: row.id, outcome: evaluation.outcome, notificationIds: consequences.notificationIds };
  });
}
