// Receives an upload as a stream straight to a file under .data/uploads (never whole in memory), telling its
// encoding from the bytes on the way, then reads its header so the person can map the columns.
import { randomUUID } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, open, readdir, rm, stat } from "node:fs/promises";
import path from "node:path";
import { Transform, type Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import { imports } from "../../db/schema";
import { decodeBuffer, EncodingSniffer } from "../lib/csv-decode.server";
import { detectDelimiter, firstRecord } from "../lib/csv-delimiter";
import type { ImportFile, StoredImport } from "../lib/csv-import-record";
import { columnLabels } from "../lib/csv-mapping";
import type { Database } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";

export const UPLOAD_DIR = path.resolve(".data/uploads");
export const MAX_UPLOAD_BYTES = 256 * 1024 * 1024;
const HEAD_BYTES = 64 * 1024;
const KEEP_UPLOADS_MS = 7 * 86_400_000;

export function uploadPath(upload: string): string {
  if (!/^[0-9a-f-]{36}$/.test(upload)) throw new Error("Not an upload name.");
  return path.join(UPLOAD_DIR, `${upload}.csv`);
}

export class UploadRefused extends Error {
  constructor(
    readonly status: 400 | 413 | 415 | 422,
    message: string,
  ) {
    super(message);
  }
}

export async function readHead(upload: string, bytes = HEAD_BYTES): Promise<Buffer> {
  const handle = await open(uploadPath(upload), "r");
  try {
    const buffer = Buffer.alloc(bytes);
    const { bytesRead } = await handle.read(buffer, 0, bytes, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

async function sweepOldUploads(now: number) {
  for (const name of await readdir(UPLOAD_DIR)) {
    const file = path.join(UPLOAD_DIR, name);
    if (now - (await stat(file)).mtimeMs > KEEP_UPLOADS_MS) await rm(file, { force: true });
  }
}

function counting(sniffer: EncodingSniffer, limit: number) {
  let total = 0;
  const counter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      total += chunk.length;
      if (total > limit) return done(new UploadRefused(413, `The file is larger than ${limit / 1024 / 1024} MB; split it and import the parts one after another.`));
      sniffer.feed(chunk);
      done(null, chunk);
    },
  });
  return { counter, bytes: () => total };
}

async function describeFile(upload: string, sniffer: EncodingSniffer, bytes: number): Promise<ImportFile> {
  const sniffed = sniffer.result();
  if (bytes === 0) throw new UploadRefused(422, "The file is empty.");
  if (sniffed.binary) throw new UploadRefused(415, "This is not a text file. Save the sheet as CSV (comma- or semicolon-separated) and upload that.");
  const text = decodeBuffer(await readHead(upload), sniffed.encoding);
  const delimiter = detectDelimiter(text);
  const header = Papa.parse<string[]>(firstRecord(text), { delimiter }).data[0] ?? [];
  if (!header.some((cell) => cell.trim())) throw new UploadRefused(422, "The file has no header line: the first line must name the columns.");
  return { encoding: sniffed.encoding, bom: sniffed.bom, delimiter, labels: columnLabels(header) };
}

/** Stores the upload and returns the new import's id; a refused upload leaves no file and an import marked failed. */
export async function receiveUpload(db: Database, viewer: Viewer, params: { filename: string; body: Readable; maxBytes?: number }): Promise<number> {
  const filename = path.basename(params.filename.trim()).slice(0, 200) || "upload.csv";
  const upload = randomUUID();
  const [row] = await db.insert(imports).values({ createdById: viewer.id, filename, status: "uploading", mapping: { upload } satisfies StoredImport }).returning({ id: imports.id });
  await mkdir(UPLOAD_DIR, { recursive: true });
  const sniffer = new EncodingSniffer();
  const { counter, bytes } = counting(sniffer, params.maxBytes ?? MAX_UPLOAD_BYTES);
  try {
    await pipeline(params.body, counter, createWriteStream(uploadPath(upload)));
    const file = await describeFile(upload, sniffer, bytes());
    const stored: StoredImport = { upload, file };
    await db.update(imports).set({ status: "mapping", bytesTotal: bytes(), mapping: stored }).where(eq(imports.id, row.id));
  } catch (error) {
    await rm(uploadPath(upload), { force: true });
    const refusal = error instanceof UploadRefused ? error : new UploadRefused(400, "The upload was interrupted before the whole file arrived; upload it again.");
    await db.update(imports).set({ status: "failed", finishedAt: new Date(), bytesTotal: bytes(), mapping: { upload, error: refusal.message } satisfies StoredImport }).where(eq(imports.id, row.id));
    throw refusal;
  }
  await sweepOldUploads(Date.now());
  return row.id;
}
