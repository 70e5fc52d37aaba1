// One instrument's series for the drift study: stages split at resetting events, limits per stage from its own
// baseline, per-point signals, and the trend, forecast and interval review of the current stage.
import { and, asc, eq, inArray, isNull, lt } from "drizzle-orm";
import { checks, instrumentEvents, pointAnnotations, users } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { DbOrTx } from "../lib/db.server";
import { analyzeSeries } from "../lib/stats/analyze";
import { reviewInterval } from "../lib/stats/interval-review";
import { fitLine, predict, predictionHalfWidth } from "../lib/stats/ols";
import { findPlan } from "./check-context.server";
import type { InstrumentDetail } from "./instruments.server";

const DAY = 86_400_000;
const RESETTING = new Set(["calibration", "adjustment", "repair", "relocation"]);

/** Every point up to `to`: a stage's baseline is its first points, even when the view starts later. */
async function loadPoints(db: DbOrTx, instrumentId: number, type: CheckType, to: Date) {
  const rows = await db
    .select({ checkId: checks.id, at: checks.performedAt, value: checks.resultG, outcome: checks.outcome, toleranceG: checks.toleranceG, acceptanceG: checks.acceptanceG, details: checks.details, operator: users.name })
    .from(checks)
    .innerJoin(users, eq(users.id, checks.operatorId))
    .where(and(eq(checks.instrumentId, instrumentId), eq(checks.checkType, type), isNull(checks.supersededAt), lt(checks.performedAt, to)))
    .orderBy(asc(checks.performedAt), asc(checks.id));
  const ids = rows.map((r) => r.checkId);
  const notes = ids.length
    ? await db.select({ checkId: pointAnnotations.checkId, excluded: pointAnnotations.excluded, reason: pointAnnotations.reason }).from(pointAnnotations).where(and(inArray(pointAnnotations.checkId, ids), isNull(pointAnnotations.withdrawnAt)))
    : [];
  return rows.map((r) => {
    const own = notes.filter((n) => n.checkId === r.checkId);
    return { ...r, excluded: own.some((n) => n.excluded), annotations: own.map((n) => n.reason) };
  });
}

/** Sensitivity errors are signed; repeatability and eccentricity results are sizes with an upper limit only. */
const isTwoSided = (type: CheckType) => type === "sensitivity";

export async function getInstrumentSeries(db: DbOrTx, instrument: InstrumentDetail, type: CheckType, range: { from: Date | null; to: Date }, now: Date) {
  const events = await db.select({ id: instrumentEvents.id, at: instrumentEvents.occurredAt, kind: instrumentEvents.kind, note: instrumentEvents.note }).from(instrumentEvents).where(eq(instrumentEvents.instrumentId, instrument.id)).orderBy(asc(instrumentEvents.occurredAt));
  const all = await loadPoints(db, instrument.id, type, range.to);
  const resets = events.filter((e) => RESETTING.has(e.kind)).map((e) => e.at);
  const stageOf = (at: Date) => resets.filter((r) => r < at).length;
  const last = all.at(-1);
  const tolerance = last?.toleranceG ?? null;
  const acceptance = last?.acceptanceG ?? null;
  const band = tolerance === null ? undefined : { upper: tolerance, ...(isTwoSided(type) ? { lower: -tolerance } : {}), guardBand: tolerance - (acceptance ?? tolerance) };

  const stages = [];
  const points = [];
  let current: ReturnType<typeof analyzeSeries> | null = null;
  let currentPoints: typeof all = [];
  for (let s = 0; s <= resets.length; s++) {
    const members = all.filter((p) => stageOf(p.at) === s);
    if (!members.length) continue;
    const kept = members.filter((p) => !p.excluded);
    const analysis = kept.length ? analyzeSeries({ values: kept.map((p) => p.value), times: kept.map((p) => p.at.toISOString()), resolution: Number(instrument.readabilityG), tolerance: band }) : null;
    const stageFrom = s === 0 ? members[0].at : resets[s - 1];
    const stageTo = s < resets.length ? resets[s] : range.to;
    stages.push({ index: s, from: stageFrom.toISOString(), to: stageTo.toISOString(), baseline: analysis?.baseline ?? null, limits: analysis?.limits ?? null, baselineEndsAt: analysis?.baseline ? kept[analysis.baseline.count - 1]?.at.toISOString() ?? null : null, warnings: analysis?.warnings ?? [] });
    let k = 0;
    for (const p of members) {
      const analyzed = p.excluded ? null : analysis?.points[k++];
      points.push({ checkId: p.checkId, at: p.at.toISOString(), value: p.value, outcome: p.outcome, excluded: p.excluded, annotations: p.annotations, operator: p.operator, stage: s, signals: analyzed?.signals ?? [], ewma: analyzed?.ewma ?? null, ewmaUcl: analyzed?.ewmaUcl ?? null, ewmaLcl: analyzed?.ewmaLcl ?? null, cusumHigh: analyzed?.cusumHigh ?? null, cusumLow: analyzed?.cusumLow ?? null, details: p.details });
    }
    if (s === resets.length || members.at(-1) === last) {
      current = analysis;
      currentPoints = kept;
    }
  }
  const signalMessages = current?.signals.map((sig) => ({ ...sig, checkId: currentPoints[sig.index]?.checkId ?? null, at: currentPoints[sig.index]?.at.toISOString() ?? null })) ?? [];
  const plan = await findPlan(db, instrument.id, type);
  const toleranceAt = current?.forecast?.earliestToleranceAt ?? current?.forecast?.toleranceAt ?? null;
  const review = plan
    ? reviewInterval({
        outcomes: currentPoints.map((p) => p.outcome),
        utilisation: currentPoints.map((p) => (p.toleranceG ? Math.abs(p.value) / p.toleranceG : 0)),
        signalCount: current?.signals.length ?? 0,
        daysToTolerance: typeof toleranceAt === "string" ? Math.max(0, (Date.parse(toleranceAt) - now.getTime()) / DAY) : null,
        intervalDays: plan.intervalDays,
      })
    : null;
  const inRange = (iso: string) => range.from === null || Date.parse(iso) >= range.from.getTime();
  return {
    instrument: { id: instrument.id, assetTag: instrument.assetTag, site: instrument.siteCode, timeZone: instrument.siteTimeZone, readabilityG: instrument.readabilityG, displayUnit: instrument.displayUnit, smallestNetWeightG: instrument.smallestNetWeightG },
    type,
    unit: "g" as const,
    requirement: { tolerance, acceptance, basis: plan?.toleranceBasis ?? null, twoSided: isTwoSided(type), safetyFactor: plan ? Number(plan.safetyFactor) : 2 },
    stages: stages.filter((s) => inRange(s.to) || s.index === resets.length),
    points: points.filter((p) => inRange(p.at)),
    events: events.filter((e) => inRange(e.at.toISOString())).map((e) => ({ ...e, at: e.at.toISOString() })),
    signals: signalMessages.filter((s) => s.at && inRange(s.at)),
    trend: current?.trend ?? null,
    trendBand: trendBand(currentPoints, current?.forecast ? 120 : 30),
    forecast: current?.forecast ?? null,
    review,
    warnings: current?.warnings ?? [],
  };
}

export type InstrumentSeries = Awaited<ReturnType<typeof getInstrumentSeries>>;

/** The fitted line and its 95 % prediction band over the current stage and `aheadDays` beyond it, for drawing. */
function trendBand(points: { at: Date; value: number }[], aheadDays: number) {
  if (points.length < 3) return [];
  const t0 = points[0].at.getTime();
  const fit = fitLine(points.map((p) => (p.at.getTime() - t0) / DAY), points.map((p) => p.value));
  if (!fit || !(fit.pValue < 0.05)) return [];
  const end = (points.at(-1)!.at.getTime() - t0) / DAY + aheadDays;
  return Array.from({ length: 25 }, (_, i) => {
    const x = (end * i) / 24;
    const half = predictionHalfWidth(fit, x);
    return { at: new Date(t0 + x * DAY).toISOString(), fit: predict(fit, x), low: predict(fit, x) - half, high: predict(fit, x) + half };
  });
}
