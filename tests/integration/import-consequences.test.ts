// What imported history sets in motion, who may import, and how refusals and interrupted jobs look.
import { readdir, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readStoredImport } from "../../app/lib/csv-import-record";
import { db } from "../../app/lib/db.server";
import { getViewer } from "../../app/queries/people.server";
import { receiveUpload, UPLOAD_DIR, UploadRefused } from "../../app/queries/imports-upload.server";
import * as apiStart from "../../app/routes/api/imports-start";
import { auditEvents, impactReviews, imports, instruments, notifications, users } from "../../db/schema";
import { startOutbox } from "../helpers/mail";
import { ADMIN, ANALYST, METROLOGIST, TECHNICIAN } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";
import { checksOf, importFile, report, status, upload } from "./import-helpers";

const HEADER = "asset_tag,check_type,performed_at,unit,weight,readings,operator_email,note\n";
let outbox: Awaited<ReturnType<typeof startOutbox>>;
beforeAll(async () => {
  outbox = await startOutbox();
});
afterAll(async () => {
  await outbox.stop();
});

async function csv(name: string, lines: string[]) {
  const file = path.join(os.tmpdir(), `tareline-${process.pid}-${name}`);
  await writeFile(file, HEADER + lines.join("\n") + "\n");
  return file;
}
const instrument = async (tag: string) => (await db().select().from(instruments).where(eq(instruments.assetTag, tag)))[0];
const viewerFor = async (email: string) => (await getViewer(db(), (await db().select().from(users).where(eq(users.email, email)))[0].id))!;

describe("a historic out-of-tolerance row", () => {
  let failing: string;
  it("takes the instrument out of service only when it is the newest check of its series", async () => {
    failing = await csv("failures.csv", ["AVP-AB-05,sensitivity,2026-12-01T10:00:00Z,g,AVP-W-05,200.5000,,newest and failing", "AVP-AB-06,sensitivity,2026-06-10T08:00:00Z,g,AVP-W-05,200.5000,,failing but long ago"]);
    const result = await importFile(failing);
    expect(result.status.status).toBe("done");
    expect(result.status.outcome).toMatchObject({ imported: 2, historicFailures: 1, outOfService: [{ assetTag: "AVP-AB-05", checkType: "sensitivity", performedAt: "2026-12-01T10:00:00.000Z" }] });
    expect((await instrument("AVP-AB-05")).status).toBe("out_of_service");
    expect((await instrument("AVP-AB-06")).status).toBe("in_service");
    const failed = (await checksOf(result.id)).find((c) => c.note === "newest and failing")!;
    expect(failed.outcome).toBe("out_of_tolerance");
    const [review] = await db().select().from(impactReviews).where(eq(impactReviews.failedCheckId, failed.id));
    expect(review.closedAt).toBeNull();
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "instrument.out_of_service"), eq(auditEvents.entityId, String(failed.instrumentId))));
    expect(audit.after).toMatchObject({ status: "out_of_service", checkId: failed.id });
    expect((await db().select().from(notifications).where(eq(notifications.episodeKey, `out_of_tolerance:${failed.instrumentId}:${failed.id}`))).length).toBeGreaterThan(0);
    expect(outbox.messages().some((m) => m.includes("AVP-AB-05 is out of service"))).toBe(true);
  });

  it("re-importing the same file reports duplicates, opens no second review, and leaves the status alone", async () => {
    const again = await importFile(failing);
    expect(again.status).toMatchObject({ status: "done", counts: { duplicates: 2, imported: 0, rejected: 0 } });
    expect(again.status.outcome?.outOfService).toEqual([]);
    const reviews = await db().select().from(impactReviews).where(eq(impactReviews.instrumentId, (await instrument("AVP-AB-05")).id));
    expect(reviews).toHaveLength(1);
  });

  it("an out-of-service instrument takes history up to the failing check, and refuses later rows", async () => {
    const file = await csv("after-failure.csv", ["AVP-AB-05,sensitivity,2026-11-20T09:00:00Z,g,AVP-W-05,200.0001,,before the failure", "AVP-AB-05,sensitivity,2026-12-01T11:00:00Z,g,AVP-W-05,200.0001,,after it"]);
    const result = await importFile(file);
    expect(result.status.status).toBe("rejected");
    expect(result.report).toEqual([expect.objectContaining({ line: "3", column: "performed_at", reason: "AVP-AB-05 has been out of service since 2026-12-01T10:00:00.000Z; later checks cannot be imported until a metrologist releases it." })]);
  });
});

describe("who may import and see an import", () => {
  it("a technician or an analyst is refused at upload with 403", async () => {
    for (const email of [TECHNICIAN, ANALYST]) expect((await upload(path.resolve(import.meta.dirname, "../fixtures/imports/tareline-format.csv"), email)).status).toBe(403);
  });

  it("an import is visible to the person who uploaded it and to administrators only", async () => {
    const mine = await importFile("semicolon-decimal-comma.csv", {}, ADMIN);
    const asMetrologist = await run((await import("../../app/routes/api/imports-status")).loader, request(`/api/v1/imports/${mine.id}`, { cookie: await cookieFor(METROLOGIST) }), { id: String(mine.id) });
    expect(asMetrologist.status).toBe(404);
    expect((await status(mine.id, ADMIN)).status).toBe("done");
  });

  it("a running or finished import cannot be started again", async () => {
    const done = await importFile("utf8-bom.csv");
    const body = JSON.stringify({ mapping: { asset_tag: "asset_tag", check_type: "check_type", performed_at: "performed_at", readings: "readings" }, unit: "g", timeZone: "site", mode: "all_or_nothing", delimiter: ",", encoding: "utf-8" });
    const again = await run(apiStart.action, request(`/api/v1/imports/${done.id}/start`, { method: "POST", cookie: await cookieFor(METROLOGIST), body }), { id: String(done.id) });
    expect(again.status).toBe(409);
    expect((again.body as { detail: string }).detail).toBe("This import is done and cannot be started again.");
  });
});

describe("refused uploads and interrupted jobs", () => {
  it("no more than three imports run at once on one server; a fourth is refused and stays waiting for its mapping", async () => {
    const id = (await upload(path.resolve(import.meta.dirname, "../fixtures/imports/tareline-format.csv"))).body as { id: number };
    const running = (globalThis.__tarelineImportJobs ??= new Map());
    const never = new Promise<void>(() => undefined);
    for (const fake of [-1, -2, -3]) running.set(fake, never);
    try {
      const body = JSON.stringify({ mapping: { asset_tag: "asset_tag", check_type: "check_type", performed_at: "performed_at", readings: "readings" }, unit: "g", timeZone: "site", mode: "all_or_nothing", delimiter: ",", encoding: "utf-8" });
      const refused = await run(apiStart.action, request(`/api/v1/imports/${id.id}/start`, { method: "POST", cookie: await cookieFor(METROLOGIST), body }), { id: String(id.id) });
      expect(refused.status).toBe(409);
      expect((await status(id.id)).status).toBe("mapping");
    } finally {
      for (const fake of [-1, -2, -3]) running.delete(fake);
    }
  });

  it.each([
    ["an empty file", Buffer.alloc(0), 422, "The file is empty."],
    ["a binary file", Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x14, 0x00, 0x08, 0x00]), 415, /^This is not a text file/],
    ["a header of blanks", Buffer.from(" , ,\n1,2\n"), 422, "The file has no header line: the first line must name the columns."],
  ])("%s is refused with %i and leaves no file behind", async (_name, bytes, code, message) => {
    const error = await receiveUpload(db(), await viewerFor(METROLOGIST), { filename: "x.csv", body: Readable.from([bytes]) }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(UploadRefused);
    expect((error as UploadRefused).status).toBe(code);
    expect((error as UploadRefused).message).toMatch(message);
    const [last] = await db().select().from(imports).orderBy(imports.id).then((rows) => rows.slice(-1));
    expect(last.status).toBe("failed");
    const { upload } = readStoredImport(last.mapping);
    expect(upload).toMatch(/^[0-9a-f-]{36}$/);
    expect(await readdir(UPLOAD_DIR)).not.toContain(`${upload}.csv`);
  });

  it("a file over the size limit is cut off with 413", async () => {
    const error = (await receiveUpload(db(), await viewerFor(METROLOGIST), { filename: "big.csv", body: Readable.from([Buffer.alloc(40_000, 65), Buffer.alloc(40_000, 65)]), maxBytes: 50_000 }).catch((e: unknown) => e)) as UploadRefused;
    expect(error.status).toBe(413);
  });

  it("a job that no process runs any more is marked failed, with nothing written", async () => {
    const viewer = await viewerFor(METROLOGIST);
    const [row] = await db().insert(imports).values({ createdById: viewer.id, filename: "cut-short.csv", status: "validating" }).returning();
    const seen = await status(row.id);
    expect(seen).toMatchObject({ status: "failed", running: false, error: "The server stopped while this import ran; nothing was written. Upload the file again." });
  });

  it("the report never lets a spreadsheet run a cell as a formula", async () => {
    const file = await csv("formula.csv", ['=HYPERLINK("http://example.invalid"),sensitivity,2026-11-18 08:00,g,AVP-W-05,200.0001,,', "AVP-AB-04,sensitivity,2026-11-18 09:00,g,AVP-W-05,-200.0001,,"]);
    const result = await importFile(file);
    const rows = await report(result.id);
    expect(rows.map((r) => r.raw)).toEqual(["'=HYPERLINK(\"http://example.invalid\"),sensitivity,2026-11-18 08:00,g,AVP-W-05,200.0001,,", "AVP-AB-04,sensitivity,2026-11-18 09:00,g,AVP-W-05,-200.0001,,"]);
    expect(rows[1].reason).toBe("Reading 1: A reading of a test load cannot be negative.");
  });
});
