// The one path every check takes — form, API or import: recompute with the engine, judge, store the readings
// exactly as entered, audit, refresh the series summary and apply the consequences, in one transaction.
import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { checkReadings, checks, instruments } from "../../db/schema";
import type { CheckType, MassUnit } from "../../db/schema/enums";
import { evaluateCheck } from "../lib/check-evaluation";
import { parseReadings } from "../lib/check-readings";
import type { Database, DbOrTx } from "../lib/db.server";
import { CheckRefused } from "../lib/domain-errors";
import { can, visibleSiteIds, type Viewer } from "../lib/permissions";
import { formatMass } from "../lib/units";
import { writeAudit } from "./audit.server";
import { findPlan, findWeight, instrumentSpec, isTrained, planWeights, requirementSpec, weightSpec } from "./check-context.server";
import { applyConsequences, type Consequences } from "./consequences.server";
import { notifyDrift, previousSummary } from "./drift-notices.server";
import { refreshSeriesSummary } from "./series-summary.server";
import { readingsEnteredSql } from "./readings-entered.server";

export interface CheckSubmission {
  instrument: { id: number } | { assetTag: string };
  type: CheckType;
  performedAt: Date;
  unit: MassUnit;
  weight?: string | null;
  readings: unknown;
  note?: string;
  source: "form" | "api" | "import";
  idempotencyKey?: string | null;
}

export interface RecordedCheck {
  id: number;
  outcome: "in_tolerance" | "guard_band" | "out_of_tolerance";
  result: { value: number; unit: "g"; tolerance: number; acceptance: number; basis: string };
  uncertainty: { expanded: number; coverageFactor: 2 } | null;
  signals: string[];
  instrumentStatus: Consequences["instrumentStatus"];
  notificationIds: number[];
  replayed: boolean;
}

const TYPE_WORDS: Record<CheckType, string> = { sensitivity: "sensitivity", repeatability: "repeatability", eccentricity: "eccentricity" };

/** The identity of a check's content: the same instrument, type, instant and readings are the same check. */
export function dedupeKey(instrumentId: number, type: CheckType, performedAt: Date, unit: MassUnit, readings: string[]): string {
  return createHash("sha256").update([instrumentId, type, performedAt.toISOString(), unit, ...readings].join("|")).digest("hex");
}

export function submissionHash(submission: CheckSubmission): string {
  const { idempotencyKey: _key, ...rest } = submission;
  return createHash("sha256").update(JSON.stringify({ ...rest, performedAt: submission.performedAt.toISOString() })).digest("hex");
}

async function loadInstrument(db: DbOrTx, viewer: Viewer, ref: CheckSubmission["instrument"]) {
  const where = "id" in ref ? eq(instruments.id, ref.id) : eq(instruments.assetTag, ref.assetTag);
  const [row] = await db.select().from(instruments).where(where).for("update");
  const ids = visibleSiteIds(viewer);
  if (!row || (ids !== null && !ids.includes(row.siteId))) throw new CheckRefused(404, [{ pointer: "/instrument", message: "No instrument with that asset tag is visible to you." }]);
  return row;
}

async function replay(db: DbOrTx, viewer: Viewer, key: string, hash: string): Promise<RecordedCheck | null> {
  const [row] = await db.select().from(checks).where(and(eq(checks.operatorId, viewer.id), eq(checks.idempotencyKey, key)));
  if (!row) return null;
  if (row.requestHash !== hash) throw new CheckRefused(409, [{ pointer: "", message: "This Idempotency-Key was already used with a different body." }], "Idempotency-Key reused");
  const [inst] = await db.select({ status: instruments.status }).from(instruments).where(eq(instruments.id, row.instrumentId));
  return {
    id: row.id,
    outcome: row.outcome,
    result: { value: row.resultG, unit: "g", tolerance: row.toleranceG ?? 0, acceptance: row.acceptanceG ?? 0, basis: row.basis },
    uncertainty: row.expandedUncertaintyG === null ? null : { expanded: row.expandedUncertaintyG, coverageFactor: 2 },
    signals: [],
    instrumentStatus: inst.status,
    notificationIds: [],
    replayed: true,
  };
}

export async function recordCheck(db: Database, viewer: Viewer, submission: CheckSubmission, now = new Date()): Promise<RecordedCheck> {
  const hash = submissionHash(submission);
  return db.transaction(async (tx) => {
    if (submission.idempotencyKey) {
      // Serialise requests that share a key so a retry racing the original cannot write a second row.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`${viewer.id}:${submission.idempotencyKey}`}))`);
      const previous = await replay(tx, viewer, submission.idempotencyKey, hash);
      if (previous) return previous;
    }
    const instrument = await loadInstrument(tx, viewer, submission.instrument);
    if (!can(viewer, "record_check", instrument.siteId)) throw new CheckRefused(403, [{ pointer: "", message: "Your role at this site does not record checks." }]);
    if (instrument.status !== "in_service") {
      const why = instrument.status === "retired" ? "is retired" : "is out of service until a metrologist releases it";
      throw new CheckRefused(422, [{ pointer: "/instrument", message: `${instrument.assetTag} ${why}; no check can be recorded on it.` }]);
    }
    if (submission.performedAt.getTime() > now.getTime() + 5 * 60_000) throw new CheckRefused(422, [{ pointer: "/performedAt", message: "The check time is in the future." }]);
    const checkDate = submission.performedAt.toISOString().slice(0, 10);
    if (!(await isTrained(tx, viewer.id, submission.type, checkDate))) {
      throw new CheckRefused(403, [{ pointer: "", message: `You have no valid training record for the ${TYPE_WORDS[submission.type]} check procedure on ${checkDate}. Ask your metrologist to record your training first.` }]);
    }
    const plan = await findPlan(tx, instrument.id, submission.type);
    if (!plan) throw new CheckRefused(422, [{ pointer: "/type", message: `${instrument.assetTag} has no ${TYPE_WORDS[submission.type]} check plan; a metrologist must set its requirement first.` }]);
    const weightRow = submission.weight ? await findWeight(tx, instrument.siteId, submission.weight) : submission.type === "repeatability" ? null : (await planWeights(tx, plan.id)).at(-1) ?? null;
    if (submission.weight && !weightRow) throw new CheckRefused(422, [{ pointer: "/weight", message: `No test weight ${submission.weight} is registered at this site.` }]);

    const parsed = parseReadings(submission.readings, { type: submission.type, unit: submission.unit, readabilityG: instrument.readabilityG });
    if (!parsed.ok) throw new CheckRefused(422, parsed.problems);
    const judged = evaluateCheck({ type: submission.type, instrument: instrumentSpec(instrument), requirement: requirementSpec(plan), weight: weightRow ? weightSpec(weightRow) : null, readings: parsed.readings, checkDate });
    if (!judged.ok) throw new CheckRefused(422, judged.problems.map((message) => ({ pointer: "/weight", message })));
    const { evaluation } = judged;
    const key = dedupeKey(instrument.id, submission.type, submission.performedAt, submission.unit, parsed.readings.map((r) => r.entered));
    const [duplicate] = await tx.select({ id: checks.id }).from(checks).where(eq(checks.dedupeKey, key));
    if (duplicate) throw new CheckRefused(409, [{ pointer: "", message: `This check (same instrument, time and readings) is already recorded as check ${duplicate.id}.` }], "Duplicate check");

    const [row] = await tx
      .insert(checks)
      .values({
        instrumentId: instrument.id,
        checkType: submission.type,
        planId: plan.id,
        weightId: weightRow?.id ?? null,
        operatorId: viewer.id,
        performedAt: submission.performedAt,
        unit: submission.unit,
        resultG: evaluation.resultG,
        expandedUncertaintyG: evaluation.expandedUncertaintyG,
        toleranceG: evaluation.toleranceG,
        acceptanceG: evaluation.acceptanceG,
        outcome: evaluation.outcome,
        basis: evaluation.basis,
        details: evaluation.details,
        source: submission.source,
        idempotencyKey: submission.idempotencyKey ?? null,
        requestHash: hash,
        dedupeKey: key,
        note: submission.note ?? "",
        readingsEntered: readingsEnteredSql(parsed.readings),
      })
      .returning();
    await tx.insert(checkReadings).values(parsed.readings.map((r, i) => ({ checkId: row.id, ordinal: i + 1, position: r.position, value: r.entered })));
    await writeAudit(tx, { actorId: viewer.id, action: "check.record", entityType: "check", entityId: String(row.id), siteId: instrument.siteId, after: { ...row, readings: parsed.readings.map((r) => r.entered) } });
    const resultText = formatMass(evaluation.resultG, submission.unit, instrument.readabilityG);
    const consequences = await applyConsequences(tx, { instrument, checkId: row.id, type: submission.type, outcome: evaluation.outcome, performedAt: submission.performedAt, resultText, actorId: viewer.id });
    const before = await previousSummary(tx, instrument.id, submission.type);
    const summary = await refreshSeriesSummary(tx, instrument.id, submission.type, now);
    const driftIds = consequences.instrumentStatus === "in_service" ? await notifyDrift(tx, { instrument, type: submission.type, checkId: row.id, before, after: summary, now }) : [];
    return {
      id: row.id,
      outcome: evaluation.outcome,
      result: { value: evaluation.resultG, unit: "g", tolerance: evaluation.toleranceG, acceptance: evaluation.acceptanceG, basis: evaluation.basis },
      uncertainty: evaluation.expandedUncertaintyG === null ? null : { expanded: evaluation.expandedUncertaintyG, coverageFactor: 2 },
      signals: summary.activeSignals,
      instrumentStatus: consequences.instrumentStatus,
      notificationIds: [...consequences.notificationIds, ...driftIds],
      replayed: false,
    } satisfies RecordedCheck;
  });
}
