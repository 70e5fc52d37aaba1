// Keeps one row per instrument × check type up to date on every write, so the fleet view never recomputes.
import { and, asc, desc, eq, gt, inArray, isNull, notExists, sql } from "drizzle-orm";
import { checks, instrumentEvents, pointAnnotations, seriesSummaries } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { DbOrTx } from "../lib/db.server";
import { analyzeSeries } from "../lib/stats/analyze";
import { reviewInterval } from "../lib/stats/interval-review";
import { findPlan } from "./check-context.server";

const RESETTING = ["calibration", "adjustment", "repair", "relocation"] as const;
const DAY = 86_400_000;

/** The series since the latest resetting event: valid, not superseded, not excluded; oldest first. */
export async function loadSeries(db: DbOrTx, instrumentId: number, type: CheckType) {
  const [reset] = await db
    .select({ at: instrumentEvents.occurredAt })
    .from(instrumentEvents)
    .where(and(eq(instrumentEvents.instrumentId, instrumentId), inArray(instrumentEvents.kind, [...RESETTING])))
    .orderBy(desc(instrumentEvents.occurredAt))
    .limit(1);
  return db
    .select({ id: checks.id, at: checks.performedAt, value: checks.resultG, toleranceG: checks.toleranceG, acceptanceG: checks.acceptanceG, outcome: checks.outcome })
    .from(checks)
    .where(
      and(
        eq(checks.instrumentId, instrumentId),
        eq(checks.checkType, type),
        isNull(checks.supersededAt),
        reset ? gt(checks.performedAt, reset.at) : undefined,
        notExists(db.select({ one: sql`1` }).from(pointAnnotations).where(and(eq(pointAnnotations.checkId, checks.id), eq(pointAnnotations.excluded, true), isNull(pointAnnotations.withdrawnAt)))),
      ),
    )
    .orderBy(asc(checks.performedAt), asc(checks.id));
}

export async function refreshSeriesSummary(db: DbOrTx, instrumentId: number, type: CheckType, now: Date) {
  const series = await loadSeries(db, instrumentId, type);
  const plan = await findPlan(db, instrumentId, type);
  const last = series.at(-1);
  const tolerance = last?.toleranceG ?? null;
  // Sensitivity errors are signed; repeatability and eccentricity results are sizes, judged on the upper side only.
  const band = tolerance === null ? undefined : type === "sensitivity" ? { upper: tolerance, lower: -tolerance, guardBand: tolerance - (last?.acceptanceG ?? tolerance) } : { upper: tolerance, guardBand: tolerance - (last?.acceptanceG ?? tolerance) };
  const analysis = series.length ? analyzeSeries({ values: series.map((p) => p.value), times: series.map((p) => p.at.toISOString()), tolerance: band }) : null;
  const lastPoint = analysis?.points.at(-1);
  const toleranceAt = analysis?.forecast?.earliestToleranceAt ?? analysis?.forecast?.toleranceAt ?? null;
  const daysToTolerance = typeof toleranceAt === "string" ? Math.max(0, (Date.parse(toleranceAt) - now.getTime()) / DAY) : null;
  const review = plan
    ? reviewInterval({
        outcomes: series.map((p) => p.outcome),
        utilisation: series.map((p) => (p.toleranceG ? Math.abs(p.value) / p.toleranceG : 0)),
        signalCount: analysis?.signals.length ?? 0,
        daysToTolerance,
        intervalDays: plan.intervalDays,
      })
    : null;
  const row = {
    instrumentId,
    checkType: type,
    computedAt: now,
    lastCheckAt: last?.at ?? null,
    nextDueAt: last && plan ? new Date(last.at.getTime() + plan.intervalDays * DAY) : null,
    pointCount: series.length,
    center: analysis?.baseline?.center ?? null,
    sigma: analysis?.baseline?.sigma ?? null,
    activeSignals: [...(lastPoint?.signals ?? [])],
    // The latest result and its limits ride along with the trend so the fleet view needs no second query.
    trend: last ? { ...(analysis?.trend ?? {}), latestValue: last.value, toleranceG: last.toleranceG, acceptanceG: last.acceptanceG } : null,
    forecast: analysis?.forecast ?? null,
    review,
  };
  await db.insert(seriesSummaries).values(row).onConflictDoUpdate({ target: [seriesSummaries.instrumentId, seriesSummaries.checkType], set: row });
  return { ...row, analysis };
}
