// Recent history per instrument for the fleet's small multiples and heat map: SQL shrinks the data
// (90 days of normalised errors, 12 weeks of worst outcomes); nothing is recomputed per request.
import { sql } from "drizzle-orm";
import type { Database } from "../lib/db.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import { anyId } from "./sql-ids.server";

export interface FleetHistory {
  weeks: string[];
  instruments: { id: number; assetTag: string; siteCode: string; normalised: { at: string; value: number }[]; weekly: ("in_tolerance" | "guard_band" | "out_of_tolerance" | null)[] }[];
}

const WORST = ["in_tolerance", "guard_band", "out_of_tolerance"] as const;

/** At most this many instruments per request: the fleet page asks for the instruments of the page it shows. */
export const FLEET_HISTORY_MAX_IDS = 200;

/**
 * With `ids`, those instruments in that order (the fleet page's sorted page); without, every visible one by asset tag.
 * Instruments of sites the viewer may not see are left out either way.
 */
export async function getFleetHistory(db: Database, viewer: Viewer, params: { site?: number; ids?: number[] }, now: Date): Promise<FleetHistory> {
  const visible = visibleSiteIds(viewer);
  const siteScope = visible === null ? sql`true` : anyId(sql`i.site_id`, visible);
  const chosen = params.ids ? anyId(sql`i.id`, params.ids) : sql`true`;
  const scope = sql`${siteScope} and ${chosen}`;
  const site = params.site ? sql`i.site_id = ${params.site}` : sql`true`;
  const since90 = new Date(now.getTime() - 90 * 86_400_000);
  const weekStart = new Date(now.getTime() - 7 * 86_400_000 * 11);
  weekStart.setUTCHours(0, 0, 0, 0);
  weekStart.setUTCDate(weekStart.getUTCDate() - ((weekStart.getUTCDay() + 6) % 7));
  const [points, weekly, instruments] = await Promise.all([
    db.execute(sql`
      select c.instrument_id, c.performed_at, c.result_g / nullif(c.tolerance_g, 0) as v
      from checks c join instruments i on i.id = c.instrument_id
      where c.check_type = 'sensitivity' and c.performed_at >= ${since90} and c.superseded_at is null and ${scope} and ${site}
      order by c.instrument_id, c.performed_at`),
    db.execute(sql`
      select c.instrument_id, floor(extract(epoch from (c.performed_at - ${weekStart}::timestamptz)) / 604800)::int as week,
             max(case c.outcome when 'in_tolerance' then 0 when 'guard_band' then 1 else 2 end) as worst
      from checks c join instruments i on i.id = c.instrument_id
      where c.performed_at >= ${weekStart} and c.superseded_at is null and ${scope} and ${site}
      group by 1, 2`),
    db.execute(sql`select i.id, i.asset_tag, s.code from instruments i join sites s on s.id = i.site_id where ${scope} and ${site} and i.status <> 'retired' order by i.asset_tag`),
  ]);
  const weeks = Array.from({ length: 12 }, (_, w) => new Date(weekStart.getTime() + w * 7 * 86_400_000).toISOString().slice(0, 10));
  const byInstrument = new Map<number, FleetHistory["instruments"][number]>();
  for (const row of instruments.rows as { id: number; asset_tag: string; code: string }[]) {
    byInstrument.set(Number(row.id), { id: Number(row.id), assetTag: row.asset_tag, siteCode: row.code, normalised: [], weekly: Array(12).fill(null) });
  }
  for (const row of points.rows as { instrument_id: number; performed_at: string; v: number | null }[]) {
    if (row.v !== null) byInstrument.get(Number(row.instrument_id))?.normalised.push({ at: new Date(row.performed_at).toISOString(), value: Number(row.v) });
  }
  for (const row of weekly.rows as { instrument_id: number; week: number; worst: number }[]) {
    const target = byInstrument.get(Number(row.instrument_id));
    if (target && row.week >= 0 && row.week < 12) target.weekly[row.week] = WORST[Number(row.worst)];
  }
  const order = params.ids ? params.ids.filter((id) => byInstrument.has(id)) : [...byInstrument.keys()];
  return { weeks, instruments: order.map((id) => byInstrument.get(id)!) };
}
