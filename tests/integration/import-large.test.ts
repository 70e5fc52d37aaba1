// A 200 MB file is read to its end in bounded memory; one bad last line rejects it as a whole, nothing written.
import { rm, stat } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { loadTargets, writeCheckCsv } from "../../scripts/lib/generate-check-csv";
import { ADMIN } from "../helpers/people";
import { checkCount, checksOf, importFile } from "./import-helpers";

const file = path.join(os.tmpdir(), `tareline-200mb-${process.pid}.csv`);
const NOTE = 1_900;
const ROWS = Math.ceil((200 * 1024 * 1024) / (NOTE + 75));

afterAll(async () => {
  await rm(file, { force: true });
});

describe("a 200 MB file", () => {
  it("is judged row by row without holding the file, and its one bad line keeps every row out", { timeout: 600_000 }, async () => {
    const targets = await loadTargets(db());
    await writeCheckCsv(file, { rows: ROWS, targets, from: new Date("2025-01-06T06:00:00Z"), to: new Date("2026-10-30T18:00:00Z"), noteChars: NOTE, lastLine: "AVP-ZZ-01,sensitivity,2026-10-31T08:00:00Z,g,AVP-W-05,200.0001,," });
    expect((await stat(file)).size).toBeGreaterThan(200 * 1024 * 1024);
    const before = await checkCount();
    let peak = process.memoryUsage().rss;
    const baseline = peak;
    const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 100);
    const result = await importFile(file, {}, ADMIN).finally(() => clearInterval(sampler));
    expect(result.status).toMatchObject({ status: "rejected", counts: { total: ROWS + 1, valid: ROWS, rejected: 1, imported: 0 } });
    expect(result.status.bytesRead).toBe(result.status.bytesTotal);
    expect(result.report).toEqual([expect.objectContaining({ line: String(ROWS + 2), column: "asset_tag", reason: 'No instrument with asset tag "AVP-ZZ-01" is visible to you.' })]);
    expect(await checksOf(result.id)).toHaveLength(0);
    expect(await checkCount()).toBe(before);
    // The file is 200 MB; the process grows by a small fraction of it.
    expect(peak - baseline).toBeLessThan(120 * 1024 * 1024);
  });
});
