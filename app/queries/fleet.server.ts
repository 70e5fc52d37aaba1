import { and, count, eq, inArray, sql } from "drizzle-orm";
import { checkPlans, checks, instruments, sites } from "../../db/schema";
import type { Database } from "../lib/db.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";

/** Instruments per site and status: one grouped query. */
export async function fleetStatusBySite(db: Database, viewer: Viewer) {
  const ids = visibleSiteIds(viewer);
  return db
    .select({ siteId: sites.id, siteCode: sites.code, siteName: sites.name, status: instruments.status, total: count() })
    .from(instruments)
    .innerJoin(sites, eq(sites.id, instruments.siteId))
    .where(ids === null ? undefined : inArray(instruments.siteId, ids.length ? ids : [-1]))
    .groupBy(sites.id, sites.code, sites.name, instruments.status)
    .orderBy(sites.code);
}

/** Active plans on in-service instruments at the viewer's sites, with the last check and the due time. */
export async function listPlansDue(db: Database, viewer: Viewer, now: Date) {
  const ids = visibleSiteIds(viewer);
  const lastCheck = db
    .select({ instrumentId: checks.instrumentId, checkType: checks.checkType, lastAt: sql<Date>`max(${checks.performedAt})`.as("last_at") })
    .from(checks)
    .groupBy(checks.instrumentId, checks.checkType)
    .as("last_check");
  const rows = await db
    .select({
      planId: checkPlans.id,
      checkType: checkPlans.checkType,
      intervalDays: checkPlans.intervalDays,
      instrumentId: instruments.id,
      assetTag: instruments.assetTag,
      siteCode: sites.code,
      lastAt: lastCheck.lastAt,
    })
    .from(checkPlans)
    .innerJoin(instruments, eq(instruments.id, checkPlans.instrumentId))
    .innerJoin(sites, eq(sites.id, instruments.siteId))
    .leftJoin(lastCheck, and(eq(lastCheck.instrumentId, checkPlans.instrumentId), eq(lastCheck.checkType, checkPlans.checkType)))
    .where(and(eq(checkPlans.active, true), eq(instruments.status, "in_service"), ids === null ? undefined : inArray(instruments.siteId, ids.length ? ids : [-1])))
    .orderBy(instruments.assetTag, checkPlans.checkType);
  return rows.map((r) => {
    const dueAt = r.lastAt ? new Date(new Date(r.lastAt).getTime() + r.intervalDays * 86_400_000) : null;
    return { ...r, dueAt, overdue: dueAt === null || dueAt.getTime() <= now.getTime() };
  });
}
