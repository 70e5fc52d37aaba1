// The fleet in one indexed query: each instrument with the series summaries kept fresh on every write,
// and its outcomes of the last 90 days counted from the checks' time index.
import { sql, type SQL } from "drizzle-orm";
import type { Database } from "../lib/db.server";
import type { FleetParams } from "../lib/fleet-params";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import { anyId } from "./sql-ids.server";

export interface FleetRow {
  id: number;
  assetTag: string;
  kind: string;
  status: "in_service" | "out_of_service" | "retired";
  siteId: number;
  siteCode: string;
  timeZone: string;
  roomName: string | null;
  readabilityG: string;
  smallestNetWeightG: string | null;
  lastCheckAt: string | null;
  nextDueAt: string | null;
  overdue: boolean;
  /** Check types past their due day in the site's calendar. */
  overdueChecks: number;
  inTolerance90: number;
  guardBand90: number;
  outOfTolerance90: number;
  driftPercentPer30Days: number | null;
  driftSignificant: boolean;
  forecastToleranceAt: string | null;
  earliestToleranceAt: string | null;
  activeSignals: string[];
  minimumWeightG: number | null;
  safetyFactor: number | null;
}

const ORDER: Record<FleetParams["sort"], SQL> = {
  forecast: sql`forecast_at`,
  drift: sql`abs(drift)`,
  nextDue: sql`next_due_at`,
  lastCheck: sql`last_check_at`,
  assetTag: sql`asset_tag`,
  status: sql`status`,
  signals: sql`signal_count`,
};

export async function listFleet(db: Database, viewer: Viewer, params: FleetParams, now: Date): Promise<FleetRow[]> {
  const ids = visibleSiteIds(viewer);
  const since = new Date(now.getTime() - 90 * 86_400_000);
  // Forecasts further out than five years say "no meaningful trend", not a date.
  const horizon = new Date(now.getTime() + 5 * 365 * 86_400_000);
  const where = sql.join(
    [
      sql`true`,
      ids === null ? sql`true` : anyId(sql`i.site_id`, ids),
      params.site ? sql`i.site_id = ${params.site}` : sql`true`,
      params.status ? sql`i.status = ${params.status}` : sql`true`,
    ],
    sql` and `,
  );
  const dir = params.dir === "desc" ? sql`desc` : sql`asc`;
  const result = await db.execute(sql`
    with due as (
      -- Overdue in the site's own days, as on the schedule: due on the local day of the last check plus the interval,
      -- overdue from the day after (an instrument out of service is not counted: it cannot be checked until released).
      select ss.instrument_id, max(ss.last_check_at) as last_check_at, min(ss.next_due_at) as next_due_at,
             count(distinct ss.check_type) filter (where i.status = 'in_service' and (ss.next_due_at at time zone st.time_zone)::date < (${now.toISOString()}::timestamptz at time zone st.time_zone)::date) as overdue_checks,
             coalesce(jsonb_agg(distinct sig) filter (where sig is not null), '[]'::jsonb) as signals
      from series_summaries ss
      join instruments i on i.id = ss.instrument_id
      join sites st on st.id = i.site_id
      left join lateral jsonb_array_elements_text(ss.active_signals) as sig on true
      group by ss.instrument_id
    ), outcomes as (
      select instrument_id,
             count(*) filter (where outcome = 'in_tolerance') as in90,
             count(*) filter (where outcome = 'guard_band') as guard90,
             count(*) filter (where outcome = 'out_of_tolerance') as out90
      from checks where performed_at >= ${since} and superseded_at is null group by instrument_id
    ), rows as (
      select i.id, i.asset_tag, i.kind, i.status, i.site_id, s.code as site_code, s.time_zone, r.name as room_name,
             i.readability_g, i.smallest_net_weight_g,
             due.last_check_at, due.next_due_at, coalesce(due.overdue_checks, 0) as overdue_checks, coalesce(due.signals, '[]'::jsonb) as signals,
             jsonb_array_length(coalesce(due.signals, '[]'::jsonb)) as signal_count,
             coalesce(o.in90, 0) as in90, coalesce(o.guard90, 0) as guard90, coalesce(o.out90, 0) as out90,
             (t.trend->>'slope')::float8 * 30 / nullif((t.trend->>'toleranceG')::float8, 0) * 100 as drift,
             (t.trend->>'pValue')::float8 < 0.05 as drift_significant,
             -- A very flat but significant trend can forecast a crossing centuries away: not a date to show.
             case when t.forecast->>'toleranceAt' ~ '^[0-9]{4}-' and (t.forecast->>'toleranceAt')::timestamptz < ${horizon} then (t.forecast->>'toleranceAt')::timestamptz end as forecast_at,
             case when t.forecast->>'earliestToleranceAt' ~ '^[0-9]{4}-' and (t.forecast->>'earliestToleranceAt')::timestamptz < ${horizon} then (t.forecast->>'earliestToleranceAt')::timestamptz end as earliest_at,
             (rep.trend->>'latestValue')::float8 * 2000 as minimum_weight,
             p.safety_factor
      from instruments i
      join sites s on s.id = i.site_id
      left join rooms r on r.id = i.room_id
      left join due on due.instrument_id = i.id
      left join outcomes o on o.instrument_id = i.id
      left join series_summaries t on t.instrument_id = i.id and t.check_type = ${params.type}
      left join series_summaries rep on rep.instrument_id = i.id and rep.check_type = 'repeatability'
      left join check_plans p on p.instrument_id = i.id and p.check_type = 'repeatability'
      where ${where}
    )
    select * from rows
    where ${params.overdue ? sql`overdue_checks > 0` : sql`true`}
    order by ${ORDER[params.sort]} ${dir} nulls last, asset_tag asc`);
  return result.rows.map((r) => {
    const row = r as Record<string, unknown>;
    const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);
    return {
      id: Number(row.id),
      assetTag: String(row.asset_tag),
      kind: String(row.kind),
      status: row.status as FleetRow["status"],
      siteId: Number(row.site_id),
      siteCode: String(row.site_code),
      timeZone: String(row.time_zone),
      roomName: (row.room_name as string | null) ?? null,
      readabilityG: String(row.readability_g),
      smallestNetWeightG: (row.smallest_net_weight_g as string | null) ?? null,
      lastCheckAt: iso(row.last_check_at),
      nextDueAt: iso(row.next_due_at),
      overdue: Number(row.overdue_checks) > 0,
      overdueChecks: Number(row.overdue_checks),
      inTolerance90: Number(row.in90),
      guardBand90: Number(row.guard90),
      outOfTolerance90: Number(row.out90),
      driftPercentPer30Days: row.drift === null ? null : Number(row.drift),
      driftSignificant: row.drift_significant === true,
      forecastToleranceAt: iso(row.forecast_at),
      earliestToleranceAt: iso(row.earliest_at),
      activeSignals: (row.signals as string[]) ?? [],
      minimumWeightG: row.minimum_weight === null ? null : Number(row.minimum_weight),
      safetyFactor: row.safety_factor === null ? null : Number(row.safety_factor),
    };
  });
}

/** Per-site figures for the comparison table, from the rows already loaded. */
export function compareSites(rows: FleetRow[]) {
  const bySite = new Map<string, { site: string; instruments: number; checks90: number; inTolerance90: number; failures90: number; overdue: number; withSignals: number; outOfService: number }>();
  for (const r of rows) {
    const s = bySite.get(r.siteCode) ?? { site: r.siteCode, instruments: 0, checks90: 0, inTolerance90: 0, failures90: 0, overdue: 0, withSignals: 0, outOfService: 0 };
    s.instruments += 1;
    s.checks90 += r.inTolerance90 + r.guardBand90 + r.outOfTolerance90;
    s.inTolerance90 += r.inTolerance90;
    s.failures90 += r.outOfTolerance90;
    s.overdue += r.overdueChecks;
    s.withSignals += r.activeSignals.length ? 1 : 0;
    s.outOfService += r.status === "out_of_service" ? 1 : 0;
    bySite.set(r.siteCode, s);
  }
  return [...bySite.values()].sort((a, b) => a.site.localeCompare(b.site));
}
