import { count, eq, inArray } from "drizzle-orm";
import { instruments, sites } from "../../db/schema";
import type { Database } from "../lib/db.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import { listPlanSchedule } from "./schedule.server";

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

/** Active plans on in-service instruments at the viewer's sites, due in each site's own calendar (see schedule.server.ts). */
export async function listPlansDue(db: Database, viewer: Viewer, now: Date) {
  const plans = await listPlanSchedule(db, viewer, now);
  return plans.map((p) => ({ ...p, overdue: p.due.state === "overdue" || p.due.state === "due_today" }));
}
