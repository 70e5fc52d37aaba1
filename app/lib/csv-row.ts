// One parsed CSV record → the cells of Tareline's fields, or the reasons the line cannot be read at all.
// Structural checks only (columns, lengths, empties); what the values mean is judged on the server.
import { MAX_RECORD_CHARS, readMarker } from "./csv-guard";
import { FIELD_LABELS, type ColumnMapping, type Delimiter, type ImportField, REQUIRED_FIELDS } from "./csv-mapping";

export const MAX_CELL_CHARS = 2_000;
// C0 control characters other than tab and line breaks; PostgreSQL text cannot hold a zero byte at all.
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F]/;
const CONTROLS = new RegExp(CONTROL.source, "g");
const RAW_KEPT_CHARS = 500;

export interface RowProblem {
  line: number;
  column: string | null;
  reason: string;
  raw: string | null;
}

export interface ColumnLayout {
  labels: string[];
  index: Partial<Record<ImportField, number>>;
  entries: [Exclude<ImportField, "readings">, number][];
  readings: number[];
  delimiter: Delimiter;
}

export type RowValues = Partial<Record<Exclude<ImportField, "readings">, string>>;
export type ReadRow = { kind: "empty" } | { kind: "problems"; problems: RowProblem[] } | { kind: "row"; values: RowValues; readingCells: string[]; fields: string[] };

export function columnLayout(labels: string[], mapping: ColumnMapping, delimiter: Delimiter): ColumnLayout {
  const index: ColumnLayout["index"] = {};
  const readings: number[] = [];
  labels.forEach((label, i) => {
    const field = mapping[label];
    if (field === "readings") readings.push(i);
    else if (field) index[field] = i;
  });
  return { labels, index, entries: Object.entries(index) as ColumnLayout["entries"], readings, delimiter };
}

/** Physical lines a record covers: one, plus the line breaks inside its quoted cells. */
export function linesSpanned(fields: string[]): number {
  const marker = readMarker(fields);
  if (marker) return 1 + marker.newlines;
  let lines = 1;
  for (const f of fields) {
    for (let at = f.indexOf("\n"); at !== -1; at = f.indexOf("\n", at + 1)) lines++;
  }
  return lines;
}

/** The line as read, shortened, with control characters shown as U+FFFD so the report itself can be stored. */
export function rawText(fields: string[], delimiter: string): string {
  const text = fields.join(delimiter).replace(CONTROLS, "\uFFFD");
  return text.length > RAW_KEPT_CHARS ? `${text.slice(0, RAW_KEPT_CHARS)}…` : text;
}

const fmt = (n: number) => n.toLocaleString("en-GB");

export function readRow(fields: string[], layout: ColumnLayout, line: number): ReadRow {
  const marker = readMarker(fields);
  if (marker) {
    const span = marker.newlines ? `Lines ${line} to ${line + marker.newlines} were read as one record (a quote opened on line ${line} runs on). ` : "";
    const reason =
      marker.kind === "too_long"
        ? `${span}The line is ${fmt(marker.length)} characters long; Tareline reads lines of up to ${fmt(MAX_RECORD_CHARS)} characters.`
        : `${span}The quoting is broken: a quoted value must end with a quote followed by the delimiter or the end of the line (write a quote inside a value as two quotes).`;
    return { kind: "problems", problems: [{ line, column: null, reason, raw: null }] };
  }
  if (fields.every((f) => f.trim() === "")) return { kind: "empty" };
  const problems: RowProblem[] = [];
  const problem = (column: string | null, reason: string) => problems.push({ line, column, reason, raw: rawText(fields, layout.delimiter) });
  const width = layout.labels.length;
  // Refused even when the extra values are empty: a value split in two (a decimal comma) shifts the rest of the line.
  if (fields.length > width) {
    const hint = layout.delimiter === "," ? " A decimal comma in a comma-separated file must be inside quotes, or the file saved with ; between columns." : "";
    problem(null, `The line has ${fields.length} values but the header has ${width} columns.${hint}`);
  }
  const missing = (i: number) => problem(layout.labels[i], `Column "${layout.labels[i]}" is missing on this line (it has ${fields.length} of ${width} values).`);
  const values: RowValues = {};
  for (const [field, i] of layout.entries) {
    if (i < fields.length) values[field] = fields[i].trim();
    else missing(i);
  }
  const readingCells: string[] = [];
  for (const i of layout.readings) {
    if (i < fields.length) readingCells.push(fields[i].trim());
    else missing(i);
  }
  for (let i = 0; i < fields.length; i++) {
    if (fields[i].length > MAX_CELL_CHARS) problem(layout.labels[i] ?? null, `The value is ${fmt(fields[i].length)} characters long; a cell holds at most ${fmt(MAX_CELL_CHARS)}.`);
    else if (CONTROL.test(fields[i])) problem(layout.labels[i] ?? null, "The value holds a control character (such as a zero byte): the file may be binary, or saved in another encoding than the one chosen.");
  }
  if (problems.length) return { kind: "problems", problems };
  for (const field of REQUIRED_FIELDS) {
    const empty = field === "readings" ? readingCells.every((c) => c === "") : !values[field as Exclude<ImportField, "readings">];
    if (empty) problem(field === "readings" ? layout.labels[layout.readings[0]] : layout.labels[layout.index[field] ?? 0], `${FIELD_LABELS[field]} is empty.`);
  }
  return problems.length ? { kind: "problems", problems } : { kind: "row", values, readingCells, fields };
}
