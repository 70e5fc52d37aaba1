// The first rows of an uploaded file, for the mapping form: decoded and split the way the import will read them.
import Papa from "papaparse";
import { decodeBuffer } from "../lib/csv-decode.server";
import { RecordGuard } from "../lib/csv-guard";
import { columnLabels, type Delimiter, type Encoding } from "../lib/csv-mapping";
import { readHead } from "./imports-upload.server";

const PREVIEW_ROWS = 8;
const CELL_CHARS = 60;

export interface ImportPreview {
  /** Column labels from the header as read with these settings; the mapping is keyed by them. */
  labels: string[];
  rows: string[][];
}

/** The header's labels and up to eight data rows, cells shortened for display, read with the given encoding and delimiter. */
export async function readPreview(upload: string, read: { encoding: Encoding; delimiter: Delimiter }): Promise<ImportPreview> {
  const { delimiter } = read;
  const head = decodeBuffer(await readHead(upload), read.encoding);
  const lastBreak = head.lastIndexOf("\n");
  const guard = new RecordGuard(delimiter);
  const text = guard.push(lastBreak >= 0 ? head.slice(0, lastBreak + 1) : head) + (lastBreak >= 0 ? "" : guard.end());
  const records = Papa.parse<string[]>(text, { delimiter, newline: "\n" }).data.filter((r) => r.some((c) => c.trim()));
  return { labels: columnLabels(records[0] ?? []), rows: records.slice(1, 1 + PREVIEW_ROWS).map((r) => r.map((c) => (c.length > CELL_CHARS ? `${c.slice(0, CELL_CHARS)}…` : c))) };
}
