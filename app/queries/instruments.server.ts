import { and, asc, count, desc, eq, ilike, inArray, or, sql, type SQL } from "drizzle-orm";
import { instruments, rooms, sites } from "../../db/schema";
import type { Database, DbOrTx } from "../lib/db.server";
import { notFound, notFoundPage } from "../lib/http.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import type { InstrumentListParams } from "../lib/search-params";
import { writeAudit } from "./audit.server";

const listColumns = {
  id: instruments.id,
  assetTag: instruments.assetTag,
  kind: instruments.kind,
  description: instruments.description,
  capacityG: instruments.capacityG,
  readabilityG: instruments.readabilityG,
  verificationIntervalG: instruments.verificationIntervalG,
  displayUnit: instruments.displayUnit,
  accuracyClass: instruments.accuracyClass,
  smallestNetWeightG: instruments.smallestNetWeightG,
  status: instruments.status,
  siteId: instruments.siteId,
  siteCode: sites.code,
  siteName: sites.name,
  roomId: instruments.roomId,
  roomName: rooms.name,
};

const SORT_COLUMNS = {
  assetTag: instruments.assetTag,
  kind: instruments.kind,
  capacity: instruments.capacityG,
  readability: instruments.readabilityG,
  room: rooms.name,
  status: instruments.status,
  site: sites.code,
};

function siteScope(viewer: Viewer): SQL | undefined {
  const ids = visibleSiteIds(viewer);
  return ids === null ? undefined : inArray(instruments.siteId, ids.length ? ids : [-1]);
}

/** One page of the instruments the viewer may see, filtered and sorted in SQL. */
export async function listInstruments(db: Database, viewer: Viewer, params: InstrumentListParams) {
  const where = and(
    siteScope(viewer),
    params.site ? eq(instruments.siteId, params.site) : undefined,
    params.room ? eq(instruments.roomId, params.room) : undefined,
    params.kind ? eq(instruments.kind, params.kind) : undefined,
    params.status ? eq(instruments.status, params.status) : undefined,
    params.q ? or(ilike(instruments.assetTag, `%${params.q}%`), ilike(instruments.description, `%${params.q}%`), ilike(instruments.serialNumber, `%${params.q}%`)) : undefined,
  );
  const order = params.dir === "desc" ? desc : asc;
  const [rows, [{ total }]] = await Promise.all([
    db
      .select(listColumns)
      .from(instruments)
      .innerJoin(sites, eq(sites.id, instruments.siteId))
      .leftJoin(rooms, eq(rooms.id, instruments.roomId))
      .where(where)
      .orderBy(order(SORT_COLUMNS[params.sort]), asc(instruments.assetTag))
      .limit(params.perPage)
      .offset((params.page - 1) * params.perPage),
    db.select({ total: count() }).from(instruments).innerJoin(sites, eq(sites.id, instruments.siteId)).leftJoin(rooms, eq(rooms.id, instruments.roomId)).where(where),
  ]);
  return { rows, total, page: params.page, perPage: params.perPage, pages: Math.max(1, Math.ceil(total / params.perPage)) };
}

export type InstrumentListRow = Awaited<ReturnType<typeof listInstruments>>["rows"][number];

async function findVisible(db: DbOrTx, viewer: Viewer, id: number) {
  if (!Number.isSafeInteger(id) || id <= 0) return null;
  const [row] = await db
    .select({ ...listColumns, serialNumber: instruments.serialNumber, riskLevel: instruments.riskLevel, ownerId: instruments.ownerId, processTolerancePercent: instruments.processTolerancePercent, createdAt: instruments.createdAt, updatedAt: instruments.updatedAt, siteTimeZone: sites.timeZone })
    .from(instruments)
    .innerJoin(sites, eq(sites.id, instruments.siteId))
    .leftJoin(rooms, eq(rooms.id, instruments.roomId))
    .where(and(eq(instruments.id, id), siteScope(viewer)));
  return row ?? null;
}

/** For pages: another site's instrument is a 404, so its existence does not leak. */
export async function getInstrumentPage(db: DbOrTx, viewer: Viewer, id: number) {
  const row = await findVisible(db, viewer, id);
  if (!row) throw notFoundPage("No instrument with that number is visible to you.");
  return row;
}

export async function getInstrumentApi(db: DbOrTx, viewer: Viewer, id: number) {
  const row = await findVisible(db, viewer, id);
  if (!row) throw notFound("No instrument with that id is visible to you.");
  return row;
}

export type InstrumentDetail = NonNullable<Awaited<ReturnType<typeof findVisible>>>;
type InstrumentValues = Omit<typeof instruments.$inferInsert, "id" | "createdAt" | "updatedAt" | "status">;

export class DuplicateAssetTagError extends Error {}

async function assertTagFree(tx: DbOrTx, assetTag: string, exceptId?: number) {
  const [clash] = await tx.select({ id: instruments.id }).from(instruments).where(sql`lower(${instruments.assetTag}) = lower(${assetTag})`);
  if (clash && clash.id !== exceptId) throw new DuplicateAssetTagError(`Asset tag ${assetTag} is already used by another instrument.`);
}

export async function createInstrument(db: Database, actor: Viewer, values: InstrumentValues) {
  return db.transaction(async (tx) => {
    await assertTagFree(tx, values.assetTag);
    const [row] = await tx.insert(instruments).values({ ...values, ownerId: values.ownerId ?? actor.id }).returning();
    await writeAudit(tx, { actorId: actor.id, action: "instrument.create", entityType: "instrument", entityId: String(row.id), siteId: row.siteId, after: row });
    return row;
  });
}

export async function updateInstrument(db: Database, actor: Viewer, id: number, values: InstrumentValues) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(instruments).where(eq(instruments.id, id)).for("update");
    await assertTagFree(tx, values.assetTag, id);
    const [after] = await tx.update(instruments).set({ ...values, updatedAt: new Date() }).where(eq(instruments.id, id)).returning();
    await writeAudit(tx, { actorId: actor.id, action: "instrument.update", entityType: "instrument", entityId: String(id), siteId: after.siteId, before, after });
    return after;
  });
}

/** Instruments are retired, never deleted: their check history stays evidence. */
export async function retireInstrument(db: Database, actor: Viewer, id: number, reason: string) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(instruments).where(eq(instruments.id, id)).for("update");
    const [after] = await tx.update(instruments).set({ status: "retired", updatedAt: new Date() }).where(eq(instruments.id, id)).returning();
    await writeAudit(tx, { actorId: actor.id, action: "instrument.retire", entityType: "instrument", entityId: String(id), siteId: after.siteId, before: { status: before.status }, after: { status: after.status, reason } });
    return after;
  });
}

export async function listSitesAndRooms(db: DbOrTx, viewer: Viewer) {
  const ids = visibleSiteIds(viewer);
  const siteRows = await db.select().from(sites).where(ids === null ? undefined : inArray(sites.id, ids.length ? ids : [-1])).orderBy(sites.code);
  const roomRows = siteRows.length ? await db.select().from(rooms).where(inArray(rooms.siteId, siteRows.map((s) => s.id))).orderBy(rooms.name) : [];
  return { sites: siteRows, rooms: roomRows };
}
