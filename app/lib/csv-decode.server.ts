// Character encodings of uploaded files, told from the bytes as they stream to disk: a byte-order mark names
// UTF-8 or UTF-16; UTF-16 without one shows as zero bytes on one side of each pair; otherwise the file is UTF-8
// when every byte sequence is valid UTF-8, else Latin-1 (read as Windows-1252, its superset).
import { isUtf8 } from "node:buffer";
import { Transform } from "node:stream";
import { RecordGuard } from "./csv-guard";
import type { Encoding } from "./csv-mapping";

const HEAD_BYTES = 4096;

export interface SniffedEncoding {
  encoding: Encoding;
  bom: boolean;
  /** Zero bytes that are not UTF-16: not a text file. */
  binary: boolean;
}

export class EncodingSniffer {
  private head = Buffer.alloc(0);
  private pending = Buffer.alloc(0);
  private utf8 = true;

  feed(chunk: Buffer): void {
    if (this.head.length < HEAD_BYTES) this.head = Buffer.concat([this.head, chunk.subarray(0, HEAD_BYTES - this.head.length)]);
    if (!this.utf8) return;
    const bytes = this.pending.length ? Buffer.concat([this.pending, chunk]) : chunk;
    const cut = completeUtf8Prefix(bytes);
    if (!isUtf8(bytes.subarray(0, cut))) this.utf8 = false;
    this.pending = Buffer.from(bytes.subarray(cut));
  }

  result(): SniffedEncoding {
    const h = this.head;
    if (h[0] === 0xef && h[1] === 0xbb && h[2] === 0xbf) return { encoding: "utf-8", bom: true, binary: false };
    if (h[0] === 0xff && h[1] === 0xfe) return { encoding: "utf-16le", bom: true, binary: false };
    if (h[0] === 0xfe && h[1] === 0xff) return { encoding: "utf-16be", bom: true, binary: false };
    let evenZeros = 0;
    let oddZeros = 0;
    for (let i = 0; i < h.length; i++) if (h[i] === 0) i % 2 === 0 ? evenZeros++ : oddZeros++;
    const pairs = Math.floor(h.length / 2);
    if (pairs > 0 && oddZeros > pairs * 0.3 && evenZeros === 0) return { encoding: "utf-16le", bom: false, binary: false };
    if (pairs > 0 && evenZeros > pairs * 0.3 && oddZeros === 0) return { encoding: "utf-16be", bom: false, binary: false };
    const valid = this.utf8 && this.pending.length === 0;
    return { encoding: valid ? "utf-8" : "windows-1252", bom: false, binary: evenZeros + oddZeros > 0 };
  }
}

/** Length of the longest prefix that does not end inside a multi-byte UTF-8 sequence. */
function completeUtf8Prefix(bytes: Buffer): number {
  const n = bytes.length;
  for (let back = 1; back <= Math.min(3, n); back++) {
    const b = bytes[n - back];
    if ((b & 0xc0) === 0x80) continue;
    const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return need > back ? n - back : n;
  }
  return n;
}

/** Decodes the first bytes of a file (the preview), dropping a byte-order mark and a character cut off at the end. */
export function decodeBuffer(bytes: Buffer, encoding: Encoding): string {
  return new TextDecoder(encoding).decode(bytes, { stream: true });
}

/**
 * Bytes of the file in, whole CSV records out (strings, for papaparse), with the bytes read so far counted for
 * the progress bar. Nothing but the current record is held.
 */
export class CsvTextStream extends Transform {
  bytesRead = 0;
  private readonly decoder: TextDecoder;
  private readonly guard: RecordGuard;

  constructor(encoding: Encoding, delimiter: string) {
    super({ readableObjectMode: true });
    this.decoder = new TextDecoder(encoding);
    this.guard = new RecordGuard(delimiter);
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, done: (error?: Error | null) => void): void {
    this.bytesRead += chunk.length;
    const text = this.guard.push(this.decoder.decode(chunk, { stream: true }));
    if (text) this.push(text);
    done();
  }

  override _flush(done: (error?: Error | null) => void): void {
    const text = this.guard.push(this.decoder.decode()) + this.guard.end();
    if (text) this.push(text);
    done();
  }
}
