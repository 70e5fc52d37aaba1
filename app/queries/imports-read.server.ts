// Reads an uploaded file as a stream: bytes → text in the file's encoding → whole records (the guard) →
// papaparse → rows with their physical line numbers, handed on in batches. Only one batch is held at a time,
// and the file is read no faster than the batches are judged and written.
import { createReadStream } from "node:fs";
import { pipeline } from "node:stream/promises";
import Papa from "papaparse";
import { CsvTextStream } from "../lib/csv-decode.server";
import { readMarker } from "../lib/csv-guard";
import { columnLabels, type ColumnMapping, type Delimiter, type Encoding } from "../lib/csv-mapping";
import { columnLayout, linesSpanned, rawText, readRow, type ColumnLayout, type ReadRow } from "../lib/csv-row";

const READ_CHUNK_BYTES = 128 * 1024;

export interface LineResult {
  line: number;
  read: Exclude<ReadRow, { kind: "empty" }>;
}

export class ImportFileError extends Error {}

const BROKEN_QUOTES = "The quoting on this line is broken: a quoted value must end with a quote followed by the delimiter or the end of the line.";

/** Calls `onBatch` with the rows of each piece of the file (header excluded, blank lines skipped) and the bytes read so far. */
export async function readImportFile(params: { path: string; file: { encoding: Encoding; delimiter: Delimiter }; mapping: ColumnMapping; onBatch: (rows: LineResult[], bytesRead: number) => Promise<void> }): Promise<void> {
  const { file } = params;
  const text = new CsvTextStream(file.encoding, file.delimiter);
  let line = 1;
  let layout: ColumnLayout | null = null;

  const judge = async (source: AsyncIterable<string>) => {
    for await (const chunk of source) {
      // The guard hands over whole records only, so each piece parses on its own; the empty last row is the final line break.
      const parsed = Papa.parse<string[]>(chunk, { delimiter: file.delimiter, newline: "\n" });
      const records = parsed.data;
      if (records.length && records[records.length - 1].length === 1 && records[records.length - 1][0] === "") records.pop();
      const broken = new Set(parsed.errors.map((e) => e.row));
      const batch: LineResult[] = [];
      records.forEach((fields, i) => {
        const at = line;
        line += linesSpanned(fields);
        if (!layout) {
          if (fields.every((f) => !f.trim())) return;
          if (readMarker(fields) || broken.has(i)) throw new ImportFileError("The header line cannot be read; the first line must name the columns.");
          layout = columnLayout(columnLabels(fields), params.mapping, file.delimiter);
          return;
        }
        if (broken.has(i)) {
          batch.push({ line: at, read: { kind: "problems", problems: [{ line: at, column: null, reason: BROKEN_QUOTES, raw: rawText(fields, file.delimiter) }] } });
          return;
        }
        const read = readRow(fields, layout, at);
        if (read.kind !== "empty") batch.push({ line: at, read });
      });
      await params.onBatch(batch, text.bytesRead);
    }
  };

  await pipeline(createReadStream(params.path, { highWaterMark: READ_CHUNK_BYTES }), text, judge);
}
