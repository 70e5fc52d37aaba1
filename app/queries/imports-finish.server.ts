// After the set-based insert, inside the same transaction: what imported history sets in motion.
// A historic failure changes an instrument's status only when it is still the newest word on that series.
import { and, count, desc, eq, gt, inArray, isNull } from "drizzle-orm";
import { checks, instrumentEvents, instruments } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { ImportOutcome } from "../lib/csv-import-record";
import type { Transaction } from "../lib/db.server";
import { RELEASE_EVENTS } from "../lib/events";
import { formatMass } from "../lib/units";
import { applyConsequences } from "./consequences.server";
import { refreshSeriesSummary } from "./series-summary.server";

export class ImportConflict extends Error {}

interface Series {
  instrumentId: number;
  type: CheckType;
}

/** Locks the instruments and refuses to go on if one changed status while the file was being checked. */
export async function lockInstruments(tx: Transaction, statuses: Map<number, string>) {
  const ids = [...statuses.keys()];
  if (!ids.length) return;
  const rows = await tx.select({ id: instruments.id, assetTag: instruments.assetTag, status: instruments.status }).from(instruments).where(inArray(instruments.id, ids)).orderBy(instruments.id).for("update");
  const changed = rows.find((r) => statuses.get(r.id) !== r.status);
  if (changed) throw new ImportConflict(`${changed.assetTag} changed status (now ${changed.status.replaceAll("_", " ")}) while the file was being checked; nothing was imported. Start the import again.`);
}

async function newestCheck(tx: Transaction, s: Series) {
  const [row] = await tx
    .select({ id: checks.id, outcome: checks.outcome, performedAt: checks.performedAt, importId: checks.importId, resultG: checks.resultG, unit: checks.unit })
    .from(checks)
    .where(and(eq(checks.instrumentId, s.instrumentId), eq(checks.checkType, s.type), isNull(checks.supersededAt)))
    .orderBy(desc(checks.performedAt), desc(checks.id))
    .limit(1);
  return row ?? null;
}

async function fixedSince(tx: Transaction, instrumentId: number, at: Date) {
  const [event] = await tx.select({ id: instrumentEvents.id }).from(instrumentEvents).where(and(eq(instrumentEvents.instrumentId, instrumentId), inArray(instrumentEvents.kind, [...RELEASE_EVENTS]), gt(instrumentEvents.occurredAt, at))).limit(1);
  return Boolean(event);
}

/** Refreshes each touched series once and applies the consequences of a newest imported row that is not within acceptance. */
export async function finishSeries(tx: Transaction, params: { importId: number; series: Series[]; actorId: number; now: Date }) {
  const outOfService: ImportOutcome["outOfService"] = [];
  const notificationIds: number[] = [];
  const takenOut = new Set<number>();
  for (const s of params.series) {
    const newest = await newestCheck(tx, s);
    if (newest && newest.importId === params.importId && newest.outcome !== "in_tolerance" && !(await fixedSince(tx, s.instrumentId, newest.performedAt))) {
      const [instrument] = await tx.select().from(instruments).where(eq(instruments.id, s.instrumentId));
      const failed = { assetTag: instrument.assetTag, checkType: s.type, performedAt: newest.performedAt.toISOString() };
      if (instrument.status === "in_service") {
        const resultText = formatMass(newest.resultG, newest.unit, instrument.readabilityG);
        const done = await applyConsequences(tx, { instrument, checkId: newest.id, type: s.type, outcome: newest.outcome, performedAt: newest.performedAt, resultText, actorId: params.actorId });
        notificationIds.push(...done.notificationIds);
        if (done.instrumentStatus === "out_of_service") {
          takenOut.add(instrument.id);
          outOfService.push(failed);
        }
      } else if (takenOut.has(instrument.id) && newest.outcome === "out_of_tolerance") {
        outOfService.push(failed);
      }
    }
    await refreshSeriesSummary(tx, s.instrumentId, s.type, params.now);
  }
  const [{ failures }] = await tx.select({ failures: count() }).from(checks).where(and(eq(checks.importId, params.importId), eq(checks.outcome, "out_of_tolerance")));
  return { outOfService, historicFailures: failures - outOfService.length, notificationIds };
}
