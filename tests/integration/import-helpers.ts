// Drives an import the way a client does: upload the file through POST /api/v1/imports, start it through
// POST /api/v1/imports/:id/start, wait for the job, then read the status and the report through their routes.
import { createReadStream } from "node:fs";
import path from "node:path";
import { Readable } from "node:stream";
import { count, eq } from "drizzle-orm";
import Papa from "papaparse";
import { expect } from "vitest";
import { db } from "../../app/lib/db.server";
import { suggestMapping, type ImportSettings } from "../../app/lib/csv-mapping";
import { waitForImport } from "../../app/queries/imports-job.server";
import * as apiImports from "../../app/routes/api/imports";
import * as apiReport from "../../app/routes/api/imports-report";
import * as apiStart from "../../app/routes/api/imports-start";
import * as apiStatus from "../../app/routes/api/imports-status";
import type { ImportStatusResponse } from "../../app/routes/api/imports-status";
import { checks } from "../../db/schema";
import { METROLOGIST } from "../helpers/people";
import { cookieFor, request, run, type Result } from "../helpers/routes";

export const FIXTURES = path.resolve(import.meta.dirname, "../fixtures/imports");

export async function upload(file: string, as = METROLOGIST): Promise<Result> {
  const cookie = await cookieFor(as);
  const body = Readable.toWeb(createReadStream(file)) as ReadableStream<Uint8Array>;
  const init = { method: "POST", body, duplex: "half", headers: { Cookie: cookie, "Content-Type": "text/csv" } } as RequestInit;
  return run(apiImports.action, new Request(`http://localhost:3999/api/v1/imports?filename=${encodeURIComponent(path.basename(file))}`, init));
}

export async function status(id: number, as = METROLOGIST): Promise<ImportStatusResponse> {
  const result = await run(apiStatus.loader, request(`/api/v1/imports/${id}`, { cookie: await cookieFor(as) }), { id: String(id) });
  expect(result.status).toBe(200);
  return result.body as ImportStatusResponse;
}

export interface ReportRow {
  line: string;
  column: string;
  reason: string;
  raw: string;
}

export async function report(id: number, as = METROLOGIST): Promise<ReportRow[]> {
  const response = (await apiReport.loader({ request: request(`/api/v1/imports/${id}/report.csv`, { cookie: await cookieFor(as) }), params: { id: String(id) }, context: {} } as never)) as Response;
  expect(response.headers.get("Content-Type")).toMatch(/^text\/csv/);
  return Papa.parse<ReportRow>(await response.text(), { header: true, skipEmptyLines: true }).data;
}

/** Uploads and imports a file with its suggested mapping (Tareline's column names) unless told otherwise. */
export async function importFile(file: string, settings: Partial<ImportSettings> = {}, as = METROLOGIST) {
  const uploaded = await upload(path.isAbsolute(file) ? file : path.join(FIXTURES, file), as);
  expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
  const created = uploaded.body as ImportStatusResponse;
  const detected = created.file!;
  const body = { mapping: suggestMapping(detected.labels), unit: "g", timeZone: "site", mode: "all_or_nothing", delimiter: detected.delimiter, encoding: detected.encoding, ...settings };
  const cookie = await cookieFor(as);
  const started = await run(apiStart.action, request(`/api/v1/imports/${created.id}/start`, { method: "POST", cookie, body: JSON.stringify(body), headers: { "Content-Type": "application/json" } }), { id: String(created.id) });
  expect(started.status, JSON.stringify(started.body)).toBe(202);
  await waitForImport(created.id);
  return { id: created.id, detected, status: await status(created.id, as), report: await report(created.id, as) };
}

export async function checksOf(importId: number) {
  return db().select().from(checks).where(eq(checks.importId, importId));
}

export async function checkCount(): Promise<number> {
  const [{ n }] = await db().select({ n: count() }).from(checks);
  return n;
}
