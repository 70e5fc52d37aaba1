// The end of an import, inside its transaction: duplicates set aside, then either nothing (all-or-nothing with
// a rejected row) or the set-based insert, the touched series and their consequences; one audit event either way.
import { eq } from "drizzle-orm";
import { imports } from "../../db/schema";
import type { ImportFile, ImportOutcome, StoredImport } from "../lib/csv-import-record";
import type { ImportSettings } from "../lib/csv-mapping";
import type { Database, Transaction } from "../lib/db.server";
import { sendMail } from "../lib/mail.server";
import type { Viewer } from "../lib/permissions";
import { writeAudit } from "./audit.server";
import { deliverNotifications } from "./consequences.server";
import { finishSeries, lockInstruments } from "./imports-finish.server";
import { insertStaged, rejectInFileDuplicates, setAsideRecorded, stagedSeries } from "./imports-stage.server";

export interface ImportRun {
  importId: number;
  upload: string;
  filename: string;
  file: ImportFile;
  settings: ImportSettings;
  viewer: Viewer;
  now: Date;
}

export interface ReadTotals {
  total: number;
  valid: number;
  rejectedWhileReading: number;
  /** Instruments with accepted rows: status when judged, and site. */
  instruments: Map<number, { status: string; siteId: number }>;
}

const NOTHING: ImportOutcome = { imported: 0, outOfService: [], historicFailures: 0, seriesRefreshed: 0 };

export async function commitStaged(db: Database, tx: Transaction, run: ImportRun, read: ReadTotals): Promise<{ status: "done" | "rejected"; afterCommit: () => Promise<void> }> {
  const repeats = await rejectInFileDuplicates(tx, run.importId);
  const recorded = await setAsideRecorded(tx, run.importId);
  const rejected = read.rejectedWhileReading + repeats;
  const siteIds = [...new Set([...read.instruments.values()].map((i) => i.siteId))].sort((a, b) => a - b);
  const counts = { totalRows: read.total, validRows: read.valid - repeats, rejectedRows: rejected, duplicateRows: recorded };
  const audit = { actorId: run.viewer.id, entityType: "import", entityId: String(run.importId), siteId: siteIds.length === 1 ? siteIds[0] : null };
  const save = async (status: "done" | "rejected", outcome: ImportOutcome) => {
    const stored: StoredImport = { upload: run.upload, file: run.file, settings: run.settings, outcome };
    await writeAudit(tx, { ...audit, action: status === "done" ? "import.commit" : "import.reject", after: { filename: run.filename, mode: run.settings.mode, ...counts, ...outcome, siteIds } });
    await tx.update(imports).set({ ...counts, status, finishedAt: new Date(), mapping: stored }).where(eq(imports.id, run.importId));
  };

  if (run.settings.mode === "all_or_nothing" && rejected > 0) {
    await save("rejected", NOTHING);
    return { status: "rejected", afterCommit: async () => undefined };
  }
  const series = await stagedSeries(tx);
  await lockInstruments(tx, new Map([...read.instruments].map(([id, i]) => [id, i.status])));
  const staged = counts.validRows - recorded;
  const imported = await insertStaged(tx, run.importId);
  // A row recorded by someone else between the check and the insert is a duplicate too.
  counts.duplicateRows += staged - imported;
  const finish = await finishSeries(tx, { importId: run.importId, series, actorId: run.viewer.id, now: new Date() });
  await save("done", { imported, outOfService: finish.outOfService, historicFailures: finish.historicFailures, seriesRefreshed: series.length });
  return { status: "done", afterCommit: () => deliverNotifications(db, finish.notificationIds, sendMail) };
}
