// One instrument's series for the drift study: stages split at resetting events, limits per stage from its own
// baseline, per-point signals, and the trend, forecast and interval review of the current stage.
import { asc, eq, sql } from "drizzle-orm";
import { instrumentEvents } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { Outcome } from "../lib/stats/requirement";
import type { DbOrTx } from "../lib/db.server";
import { analyzeSeries } from "../lib/stats/analyze";
import { reviewInterval } from "../lib/stats/interval-review";
import { fitLine, predict, predictionHalfWidth } from "../lib/stats/ols";
import { findPlan } from "./check-context.server";
import type { InstrumentDetail } from "./instruments.server";

const DAY = 86_400_000;
const RESETTING = new Set(["calibration", "adjustment", "repair", "relocation"]);

interface SeriesRow {
  checkId: number;
  atMs: number;
  value: number;
  outcome: Outcome;
  toleranceG: number | null;
  acceptanceG: number | null;
  details: Record<string, number | string | boolean | null> | null;
  operator: string;
  excluded: boolean;
  annotations: string[];
}

/**
 * Every point up to `to`: a stage's baseline is its first points, even when the view starts later.
 * One statement with the annotations aggregated per check, and times as epoch milliseconds: a three-year series
 * is a thousand rows, and building Date objects and mapping columns row by row cost more than the query itself.
 */
async function loadPoints(db: DbOrTx, instrumentId: number, type: CheckType, to: Date): Promise<SeriesRow[]> {
  const series = sql`c.instrument_id = ${instrumentId} and c.check_type = ${type} and c.superseded_at is null and c.performed_at < ${to.toISOString()}::timestamptz`;
  // Annotations are few: grouped once for the series and hash-joined, not looked up per point. Only the newest
  // point needs its engine details (the pan drawing), so only its jsonb is read.
  const result = await db.execute<Record<string, unknown>>(sql`
    with notes as (
      select pa.check_id, bool_or(pa.excluded) as excluded, array_agg(pa.reason order by pa.id) as reasons
      from point_annotations pa join checks c on c.id = pa.check_id
      where ${series} and pa.withdrawn_at is null
      group by pa.check_id
    ), newest as (
      select c.id from checks c where ${series} order by c.performed_at desc, c.id desc limit 1
    )
    select c.id, extract(epoch from c.performed_at) * 1000 as at_ms, c.result_g, c.outcome, c.tolerance_g, c.acceptance_g,
      case when c.id = (select id from newest) then c.details end as details, u.name as operator,
      coalesce(a.excluded, false) as excluded, coalesce(a.reasons, '{}') as reasons
    from checks c
    join users u on u.id = c.operator_id
    left join notes a on a.check_id = c.id
    where ${series}
    order by c.performed_at, c.id`);
  return result.rows.map((r) => ({
    checkId: Number(r.id),
    atMs: Number(r.at_ms),
    value: r.result_g as number,
    outcome: r.outcome as Outcome,
    toleranceG: r.tolerance_g as number | null,
    acceptanceG: r.acceptance_g as number | null,
    details: r.details as SeriesRow["details"],
    operator: r.operator as string,
    excluded: r.excluded as boolean,
    annotations: r.reasons as string[],
  }));
}

/**
 * EWMA and CUSUM statistics per point go out to six significant digits: far finer than any chart or decision needs,
 * and seventeen random-looking digits per number made a three-year series a fifth larger and slower to compress.
 * Results, limits, trend and forecast keep full precision.
 */
const drawn = (v: number | null | undefined) => (v === null || v === undefined ? null : Number(v.toPrecision(6)));

/** Sensitivity errors are signed; repeatability and eccentricity results are sizes with an upper limit only. */
const isTwoSided = (type: CheckType) => type === "sensitivity";

export async function getInstrumentSeries(db: DbOrTx, instrument: InstrumentDetail, type: CheckType, range: { from: Date | null; to: Date }, now: Date) {
  const [events, all, plan] = await Promise.all([
    db.select({ id: instrumentEvents.id, at: instrumentEvents.occurredAt, kind: instrumentEvents.kind, note: instrumentEvents.note }).from(instrumentEvents).where(eq(instrumentEvents.instrumentId, instrument.id)).orderBy(asc(instrumentEvents.occurredAt)),
    loadPoints(db, instrument.id, type, range.to),
    findPlan(db, instrument.id, type),
  ]);
  const resets = events.filter((e) => RESETTING.has(e.kind)).map((e) => e.at.getTime());
  const last = all.at(-1);
  const tolerance = last?.toleranceG ?? null;
  const acceptance = last?.acceptanceG ?? null;
  const band = tolerance === null ? undefined : { upper: tolerance, ...(isTwoSided(type) ? { lower: -tolerance } : {}), guardBand: tolerance - (acceptance ?? tolerance) };
  const iso = (ms: number) => new Date(ms).toISOString();

  const stages = [];
  const points = [];
  let current: ReturnType<typeof analyzeSeries> | null = null;
  let currentPoints: SeriesRow[] = [];
  // Points come in time order, so each stage is the next run of points before the next resetting event.
  let next = 0;
  for (let s = 0; s <= resets.length; s++) {
    const members: SeriesRow[] = [];
    while (next < all.length && (s === resets.length || all[next].atMs <= resets[s])) members.push(all[next++]);
    if (!members.length) continue;
    const kept = members.filter((p) => !p.excluded);
    const analysis = kept.length ? analyzeSeries({ values: kept.map((p) => p.value), timesMs: kept.map((p) => p.atMs), resolution: Number(instrument.readabilityG), tolerance: band }) : null;
    const stageFrom = s === 0 ? members[0].atMs : resets[s - 1];
    const stageTo = s < resets.length ? resets[s] : range.to.getTime();
    const baselineEnd = analysis?.baseline ? kept[analysis.baseline.count - 1] : undefined;
    stages.push({ index: s, from: iso(stageFrom), to: iso(stageTo), baseline: analysis?.baseline ?? null, limits: analysis?.limits ?? null, baselineEndsAt: baselineEnd ? iso(baselineEnd.atMs) : null, warnings: analysis?.warnings ?? [] });
    let k = 0;
    // Only the newest point carries the engine's details (the pan drawing needs them; loadPoints reads no others):
    // on every point they would triple the payload of a three-year series.
    for (const p of members) {
      const analyzed = p.excluded ? null : analysis?.points[k++];
      points.push({ checkId: p.checkId, at: iso(p.atMs), value: p.value, outcome: p.outcome, excluded: p.excluded, annotations: p.annotations, operator: p.operator, stage: s, signals: analyzed?.signals ?? [], ewma: drawn(analyzed?.ewma), ewmaUcl: drawn(analyzed?.ewmaUcl), ewmaLcl: drawn(analyzed?.ewmaLcl), cusumHigh: drawn(analyzed?.cusumHigh), cusumLow: drawn(analyzed?.cusumLow), details: p.details });
    }
    if (s === resets.length || members.at(-1) === last) {
      current = analysis;
      currentPoints = kept;
    }
  }
  const signalMessages = current?.signals.map((sig) => ({ ...sig, checkId: currentPoints[sig.index]?.checkId ?? null, at: currentPoints[sig.index] ? iso(currentPoints[sig.index].atMs) : null })) ?? [];
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
function trendBand(points: { atMs: number; value: number }[], aheadDays: number) {
  if (points.length < 3) return [];
  const t0 = points[0].atMs;
  const fit = fitLine(points.map((p) => (p.atMs - t0) / DAY), points.map((p) => p.value));
  if (!fit || !(fit.pValue < 0.05)) return [];
  const end = (points.at(-1)!.atMs - t0) / DAY + aheadDays;
  return Array.from({ length: 25 }, (_, i) => {
    const x = (end * i) / 24;
    const half = predictionHalfWidth(fit, x);
    return { at: new Date(t0 + x * DAY).toISOString(), fit: predict(fit, x), low: predict(fit, x) - half, high: predict(fit, x) + half };
  });
}
