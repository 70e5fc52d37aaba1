// Training records: who may perform which check procedure, until when; every record audited, none overwritten.
import { and, asc, eq, inArray } from "drizzle-orm";
import { memberships, sites, trainingRecords, users } from "../../db/schema";
import type { Database, DbOrTx } from "../lib/db.server";
import { can, visibleSiteIds, type Viewer } from "../lib/permissions";
import { daysBetween, localDate } from "../lib/schedule";
import { writeAudit } from "./audit.server";

export const EXPIRING_WITHIN_DAYS = 30;
export type TrainingState = "expired" | "expiring" | "current";

export function trainingState(expiresOn: string | null, today: string): { state: TrainingState; daysLeft: number | null } {
  if (expiresOn === null) return { state: "current", daysLeft: null };
  const left = daysBetween(today, expiresOn);
  return { state: left < 0 ? "expired" : left <= EXPIRING_WITHIN_DAYS ? "expiring" : "current", daysLeft: left };
}

/** Per visible site: its people and their records, judged in the site's own day. Technicians see only their own. */
export async function listTrainingBySite(db: DbOrTx, viewer: Viewer, now: Date) {
  const ids = visibleSiteIds(viewer);
  const siteRows = await db.select().from(sites).where(ids === null ? undefined : inArray(sites.id, ids.length ? ids : [-1])).orderBy(asc(sites.code));
  const members = await db
    .select({ siteId: memberships.siteId, userId: users.id, name: users.name, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(inArray(memberships.siteId, siteRows.length ? siteRows.map((s) => s.id) : [-1]), eq(users.active, true)));
  const visibleMembers = members.filter((m) => can(viewer, "view_training", m.siteId) || m.userId === viewer.id);
  const userIds = [...new Set(visibleMembers.map((m) => m.userId))];
  const records = userIds.length ? await db.select().from(trainingRecords).where(inArray(trainingRecords.userId, userIds)).orderBy(asc(trainingRecords.procedure), asc(trainingRecords.trainedOn)) : [];
  return siteRows
    .map((site) => {
      const today = localDate(now, site.timeZone);
      const people = visibleMembers.filter((m) => m.siteId === site.id);
      const rows = records
        .filter((r) => people.some((p) => p.userId === r.userId))
        .map((r) => ({ ...r, person: people.find((p) => p.userId === r.userId)!.name, ...trainingState(r.expiresOn, today) }))
        .sort((a, b) => a.person.localeCompare(b.person) || a.procedure.localeCompare(b.procedure));
      return { id: site.id, code: site.code, name: site.name, today, people, rows, canManage: can(viewer, "manage_training", site.id) };
    })
    .filter((s) => s.people.length > 0);
}

export async function recordTraining(db: Database, actor: Viewer, values: { userId: number; procedure: string; trainedOn: string; trainerName: string; expiresOn: string | null; evidence: string }) {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(trainingRecords).values({ ...values, recordedById: actor.id }).returning();
    const siteIds = (await tx.select({ siteId: memberships.siteId }).from(memberships).where(eq(memberships.userId, values.userId))).map((m) => m.siteId);
    const siteId = siteIds.find((id) => can(actor, "manage_training", id)) ?? null;
    await writeAudit(tx, { actorId: actor.id, action: "training.record", entityType: "training", entityId: String(row.id), siteId, after: row });
    return row;
  });
}

/** Whether the actor may record training for this person: they share a site where the actor manages training. */
export async function mayTrain(db: DbOrTx, actor: Viewer, userId: number): Promise<boolean> {
  const rows = await db.select({ siteId: memberships.siteId }).from(memberships).where(eq(memberships.userId, userId));
  return rows.some((r) => can(actor, "manage_training", r.siteId));
}
