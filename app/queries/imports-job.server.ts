// The import as a job in the server process. It holds a session advisory lock for as long as it runs (so a
// status poll on any instance can tell a live job from one a restart cut short) and does all its writing in one
// transaction on that same connection: COPY into the stage, then the set-based insert, consequences and audit.
import { once } from "node:events";
import { rm } from "node:fs/promises";
import { finished } from "node:stream/promises";
import { eq, sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import type { PoolClient } from "pg";
import { from as copyFrom } from "pg-copy-streams";
import * as schema from "../../db/schema";
import { importRowsRejected, imports } from "../../db/schema";
import { readStoredImport } from "../lib/csv-import-record";
import type { ImportSettings } from "../lib/csv-mapping";
import type { Database } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";
import { commitStaged, type ImportRun } from "./imports-commit.server";
import { ImportContext } from "./imports-context.server";
import { ImportConflict } from "./imports-finish.server";
import { ImportFileError, readImportFile } from "./imports-read.server";
import { RejectionWriter } from "./imports-report.server";
import { COPY_STAGE, CREATE_STAGE, copyLine } from "./imports-stage.server";
import { uploadPath } from "./imports-upload.server";
import { validateRow, type ValidationEnv } from "./imports-validate.server";

/** First key of pg_advisory_lock(int, int); the second is the import's id. */
export const IMPORT_LOCK_CLASS = 7301;
const PROGRESS_EVERY_MS = 300;
export const MAX_RUNNING_JOBS = 3;

export class ImportRefused extends Error {
  constructor(
    readonly status: 404 | 409 | 422,
    message: string,
  ) {
    super(message);
  }
}

declare global {
  var __tarelineImportJobs: Map<number, Promise<void>> | undefined;
}
const jobs = () => (globalThis.__tarelineImportJobs ??= new Map());

/** Resolves when the import's job in this process has finished (at once when none runs here). */
export function waitForImport(importId: number): Promise<void> {
  return jobs().get(importId) ?? Promise.resolve();
}

/** Claims an uploaded import (waiting for its mapping, or rejected and tried again) and starts it; returns once it runs. */
export async function startImport(db: Database, viewer: Viewer, importId: number, settings: ImportSettings, options: { now?: Date } = {}): Promise<void> {
  // Each job holds a pooled connection for its whole run; a few at once leave the rest of the app its connections.
  if (jobs().size >= MAX_RUNNING_JOBS) throw new ImportRefused(409, `${MAX_RUNNING_JOBS} imports are running on this server; start this one when one of them has finished.`);
  const client = await db.$client.connect();
  let started = false;
  try {
    const { rows } = await client.query<{ locked: boolean }>("SELECT pg_try_advisory_lock($1, $2) AS locked", [IMPORT_LOCK_CLASS, importId]);
    if (!rows[0].locked) throw new ImportRefused(409, "This import is already running.");
    const scoped = drizzle({ client, schema, casing: "snake_case" });
    const [row] = await scoped.select().from(imports).where(eq(imports.id, importId));
    const stored = readStoredImport(row?.mapping);
    if (!row || !stored.file || !stored.upload) throw new ImportRefused(404, "No such import.");
    if (row.status !== "mapping" && row.status !== "rejected") throw new ImportRefused(409, `This import is ${row.status} and cannot be started again.`);
    await scoped.delete(importRowsRejected).where(eq(importRowsRejected.importId, importId));
    const reset = { totalRows: 0, validRows: 0, rejectedRows: 0, duplicateRows: 0, bytesRead: 0, finishedAt: null };
    await scoped.update(imports).set({ ...reset, status: "validating", mapping: { upload: stored.upload, file: stored.file, settings } }).where(eq(imports.id, importId));
    const run: ImportRun = { importId, upload: stored.upload, filename: row.filename, file: stored.file, settings, viewer, now: options.now ?? new Date() };
    const job = runImport(db, client, run).finally(async () => {
      jobs().delete(importId);
      await client.query("SELECT pg_advisory_unlock($1, $2)", [IMPORT_LOCK_CLASS, importId]).catch(() => undefined);
      client.release();
    });
    jobs().set(importId, job);
    started = true;
  } finally {
    if (!started) {
      await client.query("SELECT pg_advisory_unlock($1, $2)", [IMPORT_LOCK_CLASS, importId]).catch(() => undefined);
      client.release();
    }
  }
}

function columnsOf(settings: ImportSettings): ValidationEnv["columns"] {
  const columns: ValidationEnv["columns"] = {};
  for (const [label, field] of Object.entries(settings.mapping)) columns[field] ??= label;
  return columns;
}

class Progress {
  private last = 0;
  constructor(
    private readonly db: Database,
    private readonly importId: number,
  ) {}
  async report(values: Partial<typeof imports.$inferInsert>, force = false) {
    if (!force && Date.now() - this.last < PROGRESS_EVERY_MS) return;
    this.last = Date.now();
    await this.db.update(imports).set(values).where(eq(imports.id, this.importId));
  }
}

async function runImport(db: Database, client: PoolClient, run: ImportRun): Promise<void> {
  const scoped = drizzle({ client, schema, casing: "snake_case" });
  const progress = new Progress(db, run.importId);
  const rejections = new RejectionWriter(db, run.importId);
  const ctx = new ImportContext(db, run.viewer);
  const env: ValidationEnv = { settings: run.settings, columns: columnsOf(run.settings), importerId: run.viewer.id, now: run.now };
  let outcome: Awaited<ReturnType<typeof commitStaged>>;
  try {
    outcome = await scoped.transaction(async (tx) => {
      await tx.execute(sql`SET LOCAL work_mem = '128MB'`);
      await tx.execute(CREATE_STAGE);
      const copy = client.query(copyFrom(COPY_STAGE));
      const copied = finished(copy);
      const seen = new Map<number, { status: string; siteId: number }>();
      let total = 0;
      let valid = 0;
      let bytes = 0;
      try {
        await readImportFile({
          path: uploadPath(run.upload),
          file: { encoding: run.settings.encoding, delimiter: run.settings.delimiter },
          mapping: run.settings.mapping,
          onBatch: async (rows, bytesRead) => {
            await ctx.prefetch(rows.flatMap((r) => (r.read.kind === "row" ? [r.read.values] : [])));
            const lines: string[] = [];
            for (const r of rows) {
              const staged = r.read.kind === "row" ? validateRow({ line: r.line, ...r.read }, ctx, env) : r.read.problems;
              if (Array.isArray(staged)) {
                await rejections.add(staged);
                continue;
              }
              seen.set(staged.instrumentId, { status: staged.instrumentStatus, siteId: staged.siteId });
              lines.push(copyLine(staged));
              valid++;
            }
            total += rows.length;
            bytes = bytesRead;
            if (lines.length && !copy.write(lines.join(""))) await once(copy, "drain");
            await progress.report({ bytesRead, totalRows: total, validRows: valid, rejectedRows: rejections.rows });
          },
        });
        copy.end();
        await copied;
      } catch (error) {
        copy.destroy(error instanceof Error ? error : new Error(String(error)));
        await copied.catch(() => undefined);
        throw error;
      }
      await rejections.flush();
      await progress.report({ status: "importing", bytesRead: bytes, totalRows: total, validRows: valid, rejectedRows: rejections.rows }, true);
      return commitStaged(db, tx, run, { total, valid, rejectedWhileReading: rejections.rows, instruments: seen });
    });
  } catch (error) {
    const known = error instanceof ImportFileError || error instanceof ImportConflict;
    if (!known) console.error(`Import ${run.importId} failed:`, error);
    const message = known ? error.message : "An unexpected error stopped the import; nothing was written. Try again, and tell your administrator if it keeps happening.";
    await db.update(imports).set({ status: "failed", finishedAt: new Date(), mapping: { upload: run.upload, file: run.file, settings: run.settings, error: message } }).where(eq(imports.id, run.importId));
    await rm(uploadPath(run.upload), { force: true });
    return;
  }
  // Committed: a mail or file-system hiccup from here on must not make the import look failed.
  await outcome.afterCommit().catch((error: unknown) => console.error(`Import ${run.importId}: notifications not sent yet:`, error));
  if (outcome.status === "done") await rm(uploadPath(run.upload), { force: true }).catch(() => undefined);
}
