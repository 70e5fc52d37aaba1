// Every bad-CSV case of the import issue: the per-row reason in the report, and nothing written (all-or-nothing).
import { writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { auditEvents, checkReadings } from "../../db/schema";
import { checkCount, checksOf, importFile, type ReportRow } from "./import-helpers";

let before: number;
beforeAll(async () => {
  before = await checkCount();
});

/** Imports a bad file all-or-nothing and checks that it was rejected as a whole with nothing written. */
async function rejected(file: string) {
  const result = await importFile(file);
  expect(result.status.status).toBe("rejected");
  expect(result.status.counts.imported).toBe(0);
  expect(await checksOf(result.id)).toHaveLength(0);
  expect(await checkCount()).toBe(before);
  const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "import"), eq(auditEvents.entityId, String(result.id))));
  expect(audit.action).toBe("import.reject");
  return result;
}

const row = (line: number, column: string, reason: RegExp | string) => expect.objectContaining({ line: String(line), column, reason: typeof reason === "string" ? reason : expect.stringMatching(reason) }) as unknown as ReportRow;

describe("bad rows: a clear reason per row, nothing half-written", () => {
  it("missing columns name each column the short line lacks", async () => {
    const { report, status } = await rejected("missing-columns.csv");
    expect(status.counts).toMatchObject({ total: 2, rejected: 1, valid: 1 });
    expect(report).toEqual(
      expect.arrayContaining([
        row(3, "weight", 'Column "weight" is missing on this line (it has 4 of 8 values).'),
        row(3, "readings", 'Column "readings" is missing on this line (it has 4 of 8 values).'),
        row(3, "operator_email", /is missing on this line/),
      ]),
    );
    expect(report.every((r) => r.line === "3")).toBe(true);
  });

  it("extra values say so, with the decimal-comma hint for a comma-separated file", async () => {
    const { report } = await rejected("extra-columns.csv");
    expect(report).toEqual([row(3, "", /^The line has 9 values but the header has 8 columns\. A decimal comma in a comma-separated file must be inside quotes/)]);
  });

  it("times: unparseable, in the future, skipped and repeated by a clock change", async () => {
    const { report } = await rejected("bad-times.csv");
    expect(report).toEqual([
      row(3, "performed_at", /^"09\/11\/2026 13:15" is not a time Tareline reads: write it as YYYY-MM-DD HH:MM/),
      row(4, "performed_at", /^2027-01-15T08:00:00\.000Z is in the future/),
      row(5, "performed_at", /^2026-03-29 01:30 in Europe\/London does not exist there: the clocks were put forward/),
      row(6, "performed_at", /^2026-10-25 01:30 in Europe\/London happens twice there/),
    ]);
  });

  it("unknown asset tags, weights and people; another site's weight; a site the importer has no role at", async () => {
    const { report } = await rejected("unknown-references.csv");
    expect(report).toEqual([
      row(3, "asset_tag", 'No instrument with asset tag "AVP-ZZ-99" is visible to you.'),
      row(4, "weight", 'No test weight "AVP-W-99" is registered at AVP.'),
      row(5, "weight", 'No test weight "QNW-W-02" is registered at AVP.'),
      row(6, "operator_email", "No person with the e-mail nobody@quillmere.test is registered in Tareline."),
      row(7, "asset_tag", 'No instrument with asset tag "LNT-AB-01" is visible to you.'),
    ]);
  });

  it("a row repeating an earlier line of the same file is rejected, naming that line", async () => {
    const { report, status } = await rejected("duplicate-rows.csv");
    expect(status.counts).toMatchObject({ total: 3, rejected: 1, duplicates: 0 });
    expect(report).toEqual([row(4, "", "The same check (instrument, type, time and readings) as line 2; a check is recorded once.")]);
  });

  it("an unclosed quote is reported on its line with the lines it ran over; a stray character after a closing quote too", async () => {
    const { report } = await rejected("broken-quotes.csv");
    expect(report).toEqual([row(2, "", /^Lines 2 to 4 were read as one record \(a quote opened on line 2 runs on\)\. The quoting is broken/)]);
  });

  it("the rules every check follows: training on the check date, enough readings, five positions, a known check type", async () => {
    const { report } = await rejected("rule-refusals.csv");
    expect(report).toEqual([
      row(3, "operator_email", "milo.metrologist@quillmere.test has no valid training record for the sensitivity check procedure on 2026-05-13."),
      row(4, "readings", /^Give at least 6 readings of the same load/),
      row(5, "readings", /^An eccentricity check needs 5 readings in the order centre, front-left, back-left, back-right, front-right; this line has 3\./),
      row(6, "check_type", '"calibration" is not a check type; use sensitivity, repeatability, eccentricity.'),
    ]);
  });

  it("a line of 100 000 characters is refused with its length, and the lines around it are still read", async () => {
    const file = path.join(os.tmpdir(), `tareline-long-line-${process.pid}.csv`);
    const header = "asset_tag,check_type,performed_at,unit,weight,readings,operator_email,note\n";
    const good = (minute: number) => `AVP-AB-04,sensitivity,2026-11-14 08:${minute},g,AVP-W-05,200.0001,,\n`;
    const start = "AVP-AB-04,sensitivity,2026-11-14 09:00,g,AVP-W-05,200.0001,,";
    const long = `${start}${"x".repeat(100_000 - start.length)}\n`;
    await writeFile(file, header + good(10) + long + good(20) + "AVP-AB-04,sensitivity,2026-11-14 09:30,g,AVP-W-05,abc,,\n");
    const { report, status } = await rejected(file);
    expect(long.length - 1).toBe(100_000);
    expect(status.counts).toMatchObject({ total: 4, rejected: 2, valid: 2 });
    expect(report).toEqual([row(3, "", "The line is 100,000 characters long; Tareline reads lines of up to 10,000 characters."), row(5, "readings", 'Reading 1: "abc" is not a reading in g.')]);
  });

  it("a zero byte past the start of a file is refused on its line, and the report still stores that line", async () => {
    const file = path.join(os.tmpdir(), `tareline-zero-byte-${process.pid}.csv`);
    const header = "asset_tag,check_type,performed_at,unit,weight,readings,operator_email,note\n";
    const good = Array.from({ length: 90 }, (_, i) => `AVP-AB-04,sensitivity,${new Date(Date.UTC(2026, 10, 19, 8, i, 13)).toISOString()},g,AVP-W-05,200.0001,,\n`).join("");
    await writeFile(file, header + good + "AVP-AB-04,sensitivity,2026-11-19T10:00:13Z,g,AVP-W-05,200.0001,,bad\u0000note\n");
    const { report } = await rejected(file);
    expect(report).toEqual([expect.objectContaining({ line: "92", column: "note", reason: expect.stringMatching(/^The value holds a control character/), raw: expect.stringContaining("bad\uFFFDnote") })]);
  });

  it("with 'import the valid rows' the good rows of the same file land and the report keeps the others", async () => {
    const result = await importFile("unknown-references.csv", { mode: "valid_rows" });
    expect(result.status.status).toBe("done");
    expect(result.status.counts).toMatchObject({ total: 6, rejected: 5, imported: 1 });
    const [imported] = await checksOf(result.id);
    expect(imported.performedAt.toISOString()).toBe("2026-11-10T08:15:00.000Z");
    expect((await db().select().from(checkReadings).where(eq(checkReadings.checkId, imported.id))).map((r) => r.value)).toEqual(["200.0001"]);
    expect(result.report).toHaveLength(5);
  });
});
