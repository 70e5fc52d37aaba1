// PostgreSQL's COPY … WITH (FORMAT csv) ends records with LF; RFC 4180 wants CRLF. This stream turns every record
// end into CRLF and counts the records, leaving a line break inside a quoted cell (a note typed on two lines) exactly
// as it was. COPY quotes any cell holding a quote, CR or LF, so outside quotes an LF can only end a record.
import { Transform, type TransformCallback } from "node:stream";

const LF = 0x0a;
const QUOTE = 0x22;
const CRLF = Buffer.from("\r\n");

export class CsvRecordEnds extends Transform {
  /** Records seen so far (complete lines). */
  records = 0;
  private inQuotes = false;

  override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback) {
    const parts: Buffer[] = [];
    let start = 0;
    let i = 0;
    // Positions of the next quote and LF at or after i, each searched again only once i has passed it,
    // so a chunk is scanned once however many records it holds.
    let quote = -2;
    let lf = -2;
    while (i < chunk.length) {
      if (quote !== -1 && quote < i) quote = chunk.indexOf(QUOTE, i);
      if (this.inQuotes) {
        if (quote === -1) break;
        this.inQuotes = false;
        i = quote + 1;
        continue;
      }
      if (lf !== -1 && lf < i) lf = chunk.indexOf(LF, i);
      if (quote !== -1 && (lf === -1 || quote < lf)) {
        this.inQuotes = true;
        i = quote + 1;
        continue;
      }
      if (lf === -1) break;
      parts.push(chunk.subarray(start, lf), CRLF);
      this.records += 1;
      start = i = lf + 1;
    }
    if (start === 0) return done(null, chunk);
    parts.push(chunk.subarray(start));
    done(null, Buffer.concat(parts));
  }
}
