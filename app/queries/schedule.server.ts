// The programme's calendar: every active plan with its last valid check and its due date in the site's own day.
import { and, asc, desc, eq, inArray, isNull, ne, notExists, sql } from "drizzle-orm";
import { checkPlans, checkPlanWeights, checks, instruments, pointAnnotations, rooms, sites, testWeights } from "../../db/schema";
import type { DbOrTx } from "../lib/db.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import { localDate, planDue, type PlanDue } from "../lib/schedule";

export interface ScheduledPlan {
  planId: number;
  checkType: "sensitivity" | "repeatability" | "eccentricity";
  intervalDays: number;
  instrumentId: number;
  assetTag: string;
  description: string;
  roomName: string | null;
  siteId: number;
  siteCode: string;
  timeZone: string;
  lastValidAt: Date | null;
  due: PlanDue;
  expiredWeights: string[];
}

/** Valid = not superseded by a correction, not excluded, and not out of tolerance (a failed check does not count as done). */
/**
 * The newest valid check of one plan's series (not superseded, not out of tolerance, not excluded): looked up per
 * plan on the series index, newest first, so the cost follows the number of plans, not the length of the history.
 */
function lastValidCheck(db: DbOrTx) {
  return db
    .select({ lastAt: checks.performedAt })
    .from(checks)
    .where(
      and(
        eq(checks.instrumentId, checkPlans.instrumentId),
        eq(checks.checkType, checkPlans.checkType),
        isNull(checks.supersededAt),
        ne(checks.outcome, "out_of_tolerance"),
        notExists(db.select({ one: sql`1` }).from(pointAnnotations).where(and(eq(pointAnnotations.checkId, checks.id), eq(pointAnnotations.excluded, true), isNull(pointAnnotations.withdrawnAt)))),
      ),
    )
    .orderBy(desc(checks.performedAt))
    .limit(1)
    .as("last_valid");
}

/** Active plans on in-service instruments at the viewer's sites (or one site), each with its due state at `now`. */
export async function listPlanSchedule(db: DbOrTx, viewer: Viewer | null, now: Date, filter: { siteId?: number; instrumentId?: number } = {}): Promise<ScheduledPlan[]> {
  const ids = viewer ? visibleSiteIds(viewer) : null;
  const last = lastValidCheck(db);
  const rows = await db
    .select({
      planId: checkPlans.id,
      checkType: checkPlans.checkType,
      intervalDays: checkPlans.intervalDays,
      planCreatedAt: checkPlans.createdAt,
      instrumentId: instruments.id,
      assetTag: instruments.assetTag,
      description: instruments.description,
      roomName: rooms.name,
      siteId: sites.id,
      siteCode: sites.code,
      timeZone: sites.timeZone,
      lastAt: last.lastAt,
    })
    .from(checkPlans)
    .innerJoin(instruments, eq(instruments.id, checkPlans.instrumentId))
    .innerJoin(sites, eq(sites.id, instruments.siteId))
    .leftJoin(rooms, eq(rooms.id, instruments.roomId))
    .leftJoinLateral(last, sql`true`)
    .where(
      and(
        eq(checkPlans.active, true),
        eq(instruments.status, "in_service"),
        ids === null ? undefined : inArray(instruments.siteId, ids.length ? ids : [-1]),
        filter.siteId ? eq(instruments.siteId, filter.siteId) : undefined,
        filter.instrumentId ? eq(instruments.id, filter.instrumentId) : undefined,
      ),
    )
    .orderBy(asc(sites.code), asc(instruments.assetTag), asc(checkPlans.checkType));
  const expired = await expiredWeightsByPlan(db, rows.map((r) => r.planId), now, rows);
  return rows.map((r) => {
    const lastValidAt = r.lastAt ? new Date(r.lastAt) : null;
    return {
      planId: r.planId,
      checkType: r.checkType,
      intervalDays: r.intervalDays,
      instrumentId: r.instrumentId,
      assetTag: r.assetTag,
      description: r.description,
      roomName: r.roomName,
      siteId: r.siteId,
      siteCode: r.siteCode,
      timeZone: r.timeZone,
      lastValidAt,
      due: planDue({ lastValidAt, planCreatedAt: r.planCreatedAt, intervalDays: r.intervalDays, timeZone: r.timeZone, now }),
      expiredWeights: expired.get(r.planId) ?? [],
    };
  });
}

/** Assigned weights whose certificate ran out before the site's today: the check cannot be recorded with them. */
async function expiredWeightsByPlan(db: DbOrTx, planIds: number[], now: Date, rows: { planId: number; timeZone: string }[]) {
  const out = new Map<number, string[]>();
  if (!planIds.length) return out;
  const assigned = await db
    .select({ planId: checkPlanWeights.planId, identifier: testWeights.identifier, dueOn: testWeights.dueOn })
    .from(checkPlanWeights)
    .innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId))
    .where(inArray(checkPlanWeights.planId, planIds));
  const zone = new Map(rows.map((r) => [r.planId, r.timeZone]));
  for (const a of assigned) {
    const today = localDate(now, zone.get(a.planId) ?? "UTC");
    if (a.dueOn < today) out.set(a.planId, [...(out.get(a.planId) ?? []), a.identifier]);
  }
  return out;
}

/** Overdue plans per site, for the fleet view. */
export async function overdueCountsBySite(db: DbOrTx, viewer: Viewer, now: Date): Promise<Map<number, number>> {
  const counts = new Map<number, number>();
  for (const p of await listPlanSchedule(db, viewer, now)) if (p.due.state === "overdue") counts.set(p.siteId, (counts.get(p.siteId) ?? 0) + 1);
  return counts;
}
