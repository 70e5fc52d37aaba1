// Cuts decoded CSV text into whole records before papaparse sees it, so one bad line can never swallow the rest
// of a file or the server's memory: a record longer than the limit, or with broken quoting, becomes a one-cell
// marker line that the row reader turns into a per-line reason. Record ends are normalised to "\n".
export const MAX_RECORD_CHARS = 10_000;
export type MarkerKind = "too_long" | "bad_quotes";
export interface Marker {
  kind: MarkerKind;
  /** Line breaks inside the record (quoted), so the reader keeps counting physical lines. */
  newlines: number;
  length: number;
}

const MARKER_PREFIX = "\u0001";
const MARKER = /^\u0001(too_long|bad_quotes):(\d+):(\d+)$/;
const QUOTE = 34;
const NL = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const FIELD_START = 0;
const UNQUOTED = 1;
const QUOTED = 2;
const QUOTE_IN_QUOTED = 3;
const AFTER_QUOTE = 4;

export function readMarker(cells: string[]): Marker | null {
  if (cells.length !== 1 || !cells[0].startsWith(MARKER_PREFIX)) return null;
  const m = MARKER.exec(cells[0]);
  return m ? { kind: m[1] as MarkerKind, newlines: Number(m[2]), length: Number(m[3]) } : null;
}

export class RecordGuard {
  private state = FIELD_START;
  private carry = "";
  private length = 0;
  private newlines = 0;
  private broken: MarkerKind | null = null;
  private readonly delimiter: number;

  constructor(delimiter: string, private readonly limit = MAX_RECORD_CHARS) {
    this.delimiter = delimiter.charCodeAt(0);
  }

  /** The complete records that `text` finishes, as CSV text for papaparse; an unfinished one is kept for later. */
  push(text: string): string {
    const out: string[] = [];
    let rest: string | null = text;
    while (rest !== null) rest = this.scan(rest, out);
    return out.join("");
  }

  /** Whatever the file ends with: a last record without a line break, or an opening quote that never closed. */
  end(): string {
    const out: string[] = [];
    while (this.carry.length > 0 || this.length > 0) {
      if (this.state === QUOTED) {
        const firstBreak = this.length <= this.limit ? this.carry.indexOf("\n") : -1;
        if (firstBreak >= 0) {
          const rest = this.carry.slice(firstBreak + 1);
          this.mark("bad_quotes", 0, firstBreak, out);
          let again: string | null = rest;
          while (again !== null) again = this.scan(again, out);
          continue;
        }
        this.broken ??= "bad_quotes";
      }
      if (this.broken) this.mark(this.broken, this.newlines, this.length, out);
      else this.emit(this.carry, out);
    }
    return out.join("");
  }

  private reset() {
    this.state = FIELD_START;
    this.carry = "";
    this.length = 0;
    this.newlines = 0;
    this.broken = null;
  }

  private mark(kind: MarkerKind, newlines: number, length: number, out: string[]) {
    out.push(`${MARKER_PREFIX}${kind}:${newlines}:${length}\n`);
    this.reset();
  }

  private emit(record: string, out: string[]) {
    out.push(record.charCodeAt(record.length - 1) === CR ? record.slice(0, -1) : record, "\n");
    this.reset();
  }

  /** Scans one piece of text; returns text to scan again when a never-closed quote was found, else null. */
  private scan(text: string, out: string[]): string | null {
    const d = this.delimiter;
    let start = 0;
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      this.length++;
      if (this.state === QUOTED) {
        if (c === QUOTE) this.state = QUOTE_IN_QUOTED;
        else if (c === NL) this.newlines++;
        if (this.length === this.limit + 1) {
          const record = this.carry + text.slice(start, i + 1);
          const firstBreak = record.indexOf("\n");
          // A quoted cell this long that spans lines is far likelier an opening quote that never closes:
          // refuse its first line and read the rest again as fresh lines.
          if (firstBreak >= 0) {
            this.mark("bad_quotes", 0, firstBreak, out);
            return record.slice(firstBreak + 1) + text.slice(i + 1);
          }
          this.broken = "too_long";
        }
        continue;
      }
      if (c === NL) {
        this.length--;
        if (this.broken) this.mark(this.broken, this.newlines, this.length, out);
        else this.emit(this.carry + text.slice(start, i), out);
        start = i + 1;
        continue;
      }
      if (this.state === FIELD_START) this.state = c === QUOTE ? QUOTED : c === d ? FIELD_START : UNQUOTED;
      else if (this.state === UNQUOTED) {
        if (c === d) this.state = FIELD_START;
      } else if (this.state === QUOTE_IN_QUOTED) {
        if (c === QUOTE) this.state = QUOTED;
        else if (c === d) this.state = FIELD_START;
        else if (c === SPACE || c === TAB || c === CR) this.state = AFTER_QUOTE;
        else this.breakQuotes();
      } else if (c === d) this.state = FIELD_START;
      else if (c !== SPACE && c !== TAB && c !== CR) this.breakQuotes();
      if (this.length === this.limit + 1) this.broken = "too_long";
    }
    // The record so far is kept only while it is short enough to be read; a longer one is only counted.
    this.carry = this.length <= this.limit ? this.carry + text.slice(start) : "";
    return null;
  }

  private breakQuotes() {
    this.state = UNQUOTED;
    this.broken ??= "bad_quotes";
  }
}
