// Reading the audit trail: filters by entity, person and time, scoped to the viewer's sites, newest first.
import { and, desc, eq, exists, gte, inArray, isNull, lt, or, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import { auditEvents, memberships, sites, users } from "../../db/schema";
import type { DbOrTx } from "../lib/db.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";

const optionalText = z.preprocess((v) => (v === "" || v === null ? undefined : v), z.string().trim().max(80).optional()).catch(undefined);
const optionalDate = z.preprocess((v) => (v === "" || v === null ? undefined : v), z.string().regex(/^\d{4}-\d{2}-\d{2}$/).optional()).catch(undefined);

export const AuditFilterSchema = z.object({
  entity: optionalText,
  entityId: optionalText,
  actor: z.preprocess((v) => (v === "" || v === null ? undefined : v), z.coerce.number().int().positive().optional()).catch(undefined),
  from: optionalDate,
  to: optionalDate,
  page: z.coerce.number().int().min(1).catch(1).default(1),
});
export type AuditFilter = z.infer<typeof AuditFilterSchema>;

export const AUDIT_PAGE_SIZE = 50;

/** Events at the viewer's sites, and site-less events (sign-ins, tokens) of people who hold a role at one of them. */
function scope(viewer: Viewer): SQL | undefined {
  const ids = visibleSiteIds(viewer);
  if (ids === null) return undefined;
  const siteIds = ids.length ? ids : [-1];
  return or(
    inArray(auditEvents.siteId, siteIds),
    and(isNull(auditEvents.siteId), exists(sql`(select 1 from ${memberships} where ${memberships.userId} = ${auditEvents.actorId} and ${inArray(memberships.siteId, siteIds)})`)),
  );
}

function where(viewer: Viewer, f: AuditFilter): SQL | undefined {
  // Dates are whole UTC days: the list shows both UTC and site-local times, so the boundary is stated as UTC.
  return and(
    scope(viewer),
    f.entity ? eq(auditEvents.entityType, f.entity) : undefined,
    f.entityId ? eq(auditEvents.entityId, f.entityId) : undefined,
    f.actor ? eq(auditEvents.actorId, f.actor) : undefined,
    f.from ? gte(auditEvents.at, new Date(`${f.from}T00:00:00Z`)) : undefined,
    f.to ? lt(auditEvents.at, new Date(Date.parse(`${f.to}T00:00:00Z`) + 86_400_000)) : undefined,
  );
}

const columns = {
  id: auditEvents.id,
  chainSeq: auditEvents.chainSeq,
  at: auditEvents.at,
  action: auditEvents.action,
  entityType: auditEvents.entityType,
  entityId: auditEvents.entityId,
  before: auditEvents.before,
  after: auditEvents.after,
  hash: auditEvents.hash,
  actorName: users.name,
  actorEmail: users.email,
  siteCode: sites.code,
  timeZone: sites.timeZone,
};

export async function listAuditEvents(db: DbOrTx, viewer: Viewer, f: AuditFilter) {
  const condition = where(viewer, f);
  const [rows, [{ total }]] = await Promise.all([
    db.select(columns).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId)).leftJoin(sites, eq(sites.id, auditEvents.siteId)).where(condition).orderBy(desc(auditEvents.at), desc(auditEvents.id)).limit(AUDIT_PAGE_SIZE).offset((f.page - 1) * AUDIT_PAGE_SIZE),
    db.select({ total: sql<number>`count(*)::int` }).from(auditEvents).where(condition),
  ]);
  return { rows, total, pages: Math.max(1, Math.ceil(total / AUDIT_PAGE_SIZE)) };
}

/** The same filter, oldest first, in batches: the export never holds the whole trail in memory. */
export async function* auditEventBatches(db: DbOrTx, viewer: Viewer, f: AuditFilter, batch = 1000) {
  let afterId = 0;
  for (;;) {
    const rows = await db.select(columns).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId)).leftJoin(sites, eq(sites.id, auditEvents.siteId)).where(and(where(viewer, f), sql`${auditEvents.id} > ${afterId}`)).orderBy(auditEvents.id).limit(batch);
    if (!rows.length) return;
    yield rows;
    afterId = rows.at(-1)!.id;
  }
}

export async function auditFilterChoices(db: DbOrTx, viewer: Viewer) {
  const [entities, actors] = await Promise.all([
    db.selectDistinct({ entityType: auditEvents.entityType }).from(auditEvents).where(scope(viewer)).orderBy(auditEvents.entityType),
    db.selectDistinct({ id: users.id, name: users.name }).from(auditEvents).innerJoin(users, eq(users.id, auditEvents.actorId)).where(scope(viewer)).orderBy(users.name),
  ]);
  return { entities: entities.map((e) => e.entityType), actors };
}

export type AuditRow = Awaited<ReturnType<typeof listAuditEvents>>["rows"][number];

/** Keys whose value differs between before and after, as short JSON texts; a creation lists every field. */
export function changedFields(before: unknown, after: unknown): { field: string; before: string; after: string }[] {
  const b = (before && typeof before === "object" ? before : {}) as Record<string, unknown>;
  const a = (after && typeof after === "object" ? after : {}) as Record<string, unknown>;
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])];
  const text = (v: unknown) => (v === undefined ? "—" : JSON.stringify(v).slice(0, 200));
  return keys.filter((k) => JSON.stringify(b[k]) !== JSON.stringify(a[k])).map((k) => ({ field: k, before: text(b[k]), after: text(a[k]) }));
}
