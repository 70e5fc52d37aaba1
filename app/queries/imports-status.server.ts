// An import as its owner sees it: status, progress and result, in a JSON-ready shape shared by the page's
// loader and GET /api/v1/imports/:id. A job that a restart cut short is noticed here and marked failed.
import { access } from "node:fs/promises";
import { and, desc, eq, inArray } from "drizzle-orm";
import { imports } from "../../db/schema";
import { readStoredImport, RUNNING_STATUSES, STATUS_LABELS, type ImportFile, type ImportOutcome, type ImportStatus, IMPORT_STATUSES } from "../lib/csv-import-record";
import type { ImportMode } from "../lib/csv-mapping";
import type { Database } from "../lib/db.server";
import { isAdmin, type Viewer } from "../lib/permissions";
import { IMPORT_LOCK_CLASS } from "./imports-job.server";
import { uploadPath } from "./imports-upload.server";

const UPLOAD_GIVES_UP_MS = 2 * 3_600_000;

export interface ImportStatusView {
  id: number;
  filename: string;
  status: ImportStatus;
  statusLabel: string;
  running: boolean;
  createdAt: string;
  finishedAt: string | null;
  bytesTotal: number | null;
  bytesRead: number;
  counts: { total: number; valid: number; rejected: number; duplicates: number; imported: number };
  /** As detected on upload: what a client needs to build the mapping (labels are the header's column names). */
  file: ImportFile | null;
  mode: ImportMode | null;
  outcome: ImportOutcome | null;
  error: string | null;
  reportUrl: string | null;
  /** Rejected as a whole, with valid rows and the file still kept: it can be run again importing those. */
  canImportValidRows: boolean;
}

type ImportRow = typeof imports.$inferSelect;

const asStatus = (s: string): ImportStatus => IMPORT_STATUSES.find((x) => x === s) ?? "failed";

/** The import if the viewer may see it: the person who uploaded it, or an administrator. */
export async function findImport(db: Database, viewer: Viewer, importId: number): Promise<ImportRow | null> {
  if (!Number.isInteger(importId) || importId <= 0) return null;
  const [row] = await db.select().from(imports).where(eq(imports.id, importId));
  return row && (row.createdById === viewer.id || isAdmin(viewer)) ? row : null;
}

async function jobIsAlive(db: Database, importId: number): Promise<boolean> {
  const client = await db.$client.connect();
  try {
    const { rows } = await client.query<{ free: boolean }>("SELECT pg_try_advisory_lock($1, $2) AS free", [IMPORT_LOCK_CLASS, importId]);
    if (rows[0].free) await client.query("SELECT pg_advisory_unlock($1, $2)", [IMPORT_LOCK_CLASS, importId]);
    return !rows[0].free;
  } finally {
    client.release();
  }
}

/** Marks an import failed when nothing runs it any more; its transaction never committed, so nothing was written. */
export async function settleStale(db: Database, row: ImportRow): Promise<ImportRow> {
  const status = asStatus(row.status);
  if (!RUNNING_STATUSES.includes(status)) return row;
  const stale = status === "uploading" ? Date.now() - row.createdAt.getTime() > UPLOAD_GIVES_UP_MS : !(await jobIsAlive(db, row.id));
  if (!stale) return row;
  const error = status === "uploading" ? "The upload did not finish; upload the file again." : "The server stopped while this import ran; nothing was written. Upload the file again.";
  const [settled] = await db
    .update(imports)
    .set({ status: "failed", finishedAt: new Date(), mapping: { ...readStoredImport(row.mapping), error } })
    .where(and(eq(imports.id, row.id), inArray(imports.status, [...RUNNING_STATUSES])))
    .returning();
  return settled ?? row;
}

async function fileKept(upload: string | undefined) {
  if (!upload) return false;
  return access(uploadPath(upload)).then(
    () => true,
    () => false,
  );
}

export async function importStatusView(row: ImportRow): Promise<ImportStatusView> {
  const stored = readStoredImport(row.mapping);
  const status = asStatus(row.status);
  const imported = stored.outcome?.imported ?? 0;
  return {
    id: row.id,
    filename: row.filename,
    status,
    statusLabel: STATUS_LABELS[status],
    running: RUNNING_STATUSES.includes(status),
    createdAt: row.createdAt.toISOString(),
    finishedAt: row.finishedAt?.toISOString() ?? null,
    bytesTotal: row.bytesTotal,
    bytesRead: row.bytesRead,
    counts: { total: row.totalRows, valid: row.validRows, rejected: row.rejectedRows, duplicates: row.duplicateRows, imported },
    file: stored.file ?? null,
    mode: stored.settings?.mode ?? null,
    outcome: stored.outcome ?? null,
    error: stored.error ?? null,
    reportUrl: row.rejectedRows + row.duplicateRows > 0 ? `/api/v1/imports/${row.id}/report.csv` : null,
    canImportValidRows: status === "rejected" && row.validRows > 0 && (await fileKept(stored.upload)),
  };
}

export async function listImports(db: Database, viewer: Viewer, limit = 30): Promise<ImportStatusView[]> {
  const rows = await db
    .select()
    .from(imports)
    .where(isAdmin(viewer) ? undefined : eq(imports.createdById, viewer.id))
    .orderBy(desc(imports.id))
    .limit(limit);
  return Promise.all(rows.map(async (r) => importStatusView(await settleStale(db, r))));
}

