// What an import keeps about itself in `imports.mapping` (jsonb): the file as detected on upload, the settings it
// was started with and, once finished, its outcome. Read back through these schemas, never trusted as is.
import { z } from "zod";
import { DELIMITERS, ENCODINGS, ImportSettingsSchema } from "./csv-mapping";

export const IMPORT_STATUSES = ["uploading", "mapping", "validating", "importing", "rejected", "done", "failed"] as const;
export type ImportStatus = (typeof IMPORT_STATUSES)[number];
export const RUNNING_STATUSES: readonly ImportStatus[] = ["uploading", "validating", "importing"];

export const STATUS_LABELS: Record<ImportStatus, string> = {
  uploading: "Uploading",
  mapping: "Waiting for column mapping",
  validating: "Checking every row",
  importing: "Writing checks",
  rejected: "Not imported",
  done: "Imported",
  failed: "Stopped by an error",
};

export const ImportFileSchema = z.object({
  encoding: z.enum(ENCODINGS),
  bom: z.boolean(),
  delimiter: z.enum(DELIMITERS),
  labels: z.array(z.string()),
});
export type ImportFile = z.infer<typeof ImportFileSchema>;

const SeriesRef = z.object({ assetTag: z.string(), checkType: z.string(), performedAt: z.string() });

export const ImportOutcomeSchema = z.object({
  imported: z.number().int(),
  /** Series whose newest check is an imported out-of-tolerance row: the instrument was taken out of service. */
  outOfService: z.array(SeriesRef),
  /** Imported out-of-tolerance rows that are not the newest of their series: recorded as history only. */
  historicFailures: z.number().int(),
  seriesRefreshed: z.number().int(),
});
export type ImportOutcome = z.infer<typeof ImportOutcomeSchema>;

export const StoredImportSchema = z.object({
  /** Name of the uploaded file under .data/uploads: random, so databases sharing a folder (tests, benches) never collide. */
  upload: z.string().regex(/^[0-9a-f-]{36}$/).optional(),
  file: ImportFileSchema.optional(),
  settings: ImportSettingsSchema.optional(),
  outcome: ImportOutcomeSchema.optional(),
  error: z.string().optional(),
});
export type StoredImport = z.infer<typeof StoredImportSchema>;

export function readStoredImport(value: unknown): StoredImport {
  const parsed = StoredImportSchema.safeParse(value ?? {});
  return parsed.success ? parsed.data : {};
}
