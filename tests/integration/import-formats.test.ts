// Files that must import, whatever their dialect: Tareline's own format, ; with decimal commas, four encodings,
// quoted line breaks, blank lines, units in cells, wall times in each site's zone; and a re-import adds nothing.
import { and, asc, eq, inArray } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import { auditEvents, checkReadings, instruments, seriesSummaries, users } from "../../db/schema";
import { ADMIN, METROLOGIST } from "../helpers/people";
import { checkCount, checksOf, importFile } from "./import-helpers";

async function readingsOf(checkIds: number[]) {
  return db().select().from(checkReadings).where(inArray(checkReadings.checkId, checkIds)).orderBy(asc(checkReadings.checkId), asc(checkReadings.ordinal));
}
const userId = async (email: string) => (await db().select().from(users).where(eq(users.email, email)))[0].id;
const byTime = <T extends { performedAt: Date }>(rows: T[]) => [...rows].sort((a, b) => a.performedAt.getTime() - b.performedAt.getTime());

describe("Tareline's own format", () => {
  it("imports every row with the engine's judgement, readings as written, the named operator or the importer, one audit event", async () => {
    const [avp03] = await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-AB-03"));
    const summary = async () => (await db().select().from(seriesSummaries).where(and(eq(seriesSummaries.instrumentId, avp03.id), eq(seriesSummaries.checkType, "sensitivity"))))[0];
    const pointsBefore = (await summary()).pointCount;
    const result = await importFile("tareline-format.csv", {}, ADMIN);
    expect(result.status).toMatchObject({ status: "done", counts: { total: 4, valid: 4, rejected: 0, duplicates: 0, imported: 4 } });
    const rows = byTime(await checksOf(result.id));
    expect(rows.map((r) => [r.checkType, r.unit, r.source, r.outcome])).toEqual([
      ["sensitivity", "g", "import", "in_tolerance"],
      ["repeatability", "g", "import", "in_tolerance"],
      ["eccentricity", "g", "import", "in_tolerance"],
      ["sensitivity", "kg", "import", "in_tolerance"],
    ]);
    const [milo, ada] = [await userId(METROLOGIST), await userId(ADMIN)];
    expect(rows.map((r) => r.operatorId)).toEqual([milo, milo, ada, ada]);
    expect(rows.map((r) => r.details?.operatorNamed)).toEqual([true, true, false, false]);
    expect(rows[0].performedAt.toISOString()).toBe("2026-11-02T08:15:00.000Z");
    expect(rows[2].note).toBe("Load 200 g, corners at about a third of the pan radius");
    expect(rows[3].resultG).toBeCloseTo(5000.01 - Number(rows[3].details?.referenceMassG), 9);
    const readings = await readingsOf(rows.map((r) => r.id));
    expect(readings.filter((r) => r.checkId === rows[3].id).map((r) => r.value)).toEqual(["5.00001"]);
    expect(readings.filter((r) => r.checkId === rows[1].id)).toHaveLength(10);
    expect(readings.filter((r) => r.checkId === rows[2].id).map((r) => r.position)).toEqual(["centre", "front-left", "back-left", "back-right", "front-right"]);
    const audits = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "import"), eq(auditEvents.entityId, String(result.id))));
    expect(audits.map((a) => a.action)).toEqual(["import.commit"]);
    expect(audits[0].after).toMatchObject({ imported: 4, rejectedRows: 0, filename: "tareline-format.csv" });
    expect((await summary()).pointCount).toBe(pointsBefore + 1);
  });

  it("a clean re-import adds zero rows and reports every row as already recorded", async () => {
    const before = await checkCount();
    const again = await importFile("tareline-format.csv", {}, ADMIN);
    expect(again.status).toMatchObject({ status: "done", counts: { total: 4, rejected: 0, duplicates: 4, imported: 0 } });
    expect(await checkCount()).toBe(before);
    expect(again.report.map((r) => r.reason)).toEqual(Array.from({ length: 4 }, () => expect.stringMatching(/^Already recorded as check \d+; not imported again\.$/)));
  });

  it("a row already recorded through the form or API path is a duplicate too: the content key is the same", async () => {
    const viewer = (await getViewer(db(), await userId(METROLOGIST)))!;
    await recordCheck(db(), viewer, { instrument: { assetTag: "AVP-AB-06" }, type: "sensitivity", performedAt: new Date("2026-11-07T08:15:00Z"), unit: "g", readings: ["200.0001"], source: "api", weight: "AVP-W-05" });
    const result = await importFile("empty-lines.csv");
    expect(result.status.counts).toMatchObject({ total: 2, duplicates: 1, imported: 1 });
  });
});

describe("dialects and encodings", () => {
  it("reads ; between columns and decimal commas", async () => {
    const result = await importFile("semicolon-decimal-comma.csv");
    expect(result.detected.delimiter).toBe(";");
    expect(result.status.counts.imported).toBe(2);
    const rows = byTime(await checksOf(result.id));
    expect((await readingsOf([rows[0].id])).map((r) => r.value)).toEqual(["200.0001"]);
    expect(rows[1].note).toBe("Wägung über die Ecken");
  });

  it.each([
    ["utf8-bom.csv", "utf-8", true, "Prüfung vor Schichtbeginn – Raum 2"],
    ["utf16le-bom.csv", "utf-16le", true, "Prüfung vor Schichtbeginn – Raum 2"],
    ["utf16be-bom.csv", "utf-16be", true, "Prüfung vor Schichtbeginn – Raum 2"],
    ["latin1.csv", "windows-1252", false, "Prüfung vor Schichtbeginn - Raum 2"],
  ])("tells %s as %s and decodes its text exactly", async (file, encoding, bom, note) => {
    const result = await importFile(file);
    expect(result.detected).toMatchObject({ encoding, bom, labels: expect.arrayContaining(["asset_tag", "note"]) });
    expect(result.status.counts).toMatchObject({ imported: 2, rejected: 0 });
    expect(byTime(await checksOf(result.id)).map((r) => r.note)).toEqual([note, "Kontrolle nach Reinigung"]);
  });

  it("keeps line breaks inside quotes and still counts physical lines for the report", async () => {
    const result = await importFile("quoted-newlines.csv", { mode: "valid_rows" });
    expect(result.status.counts).toMatchObject({ total: 3, imported: 2, rejected: 1 });
    expect(byTime(await checksOf(result.id))[0].note).toBe('First line of the note\nsecond line, with a comma\nthird line with "quotes"');
    expect(result.report).toEqual([expect.objectContaining({ line: "6", column: "readings", reason: 'Reading 1: "not-a-number" is not a reading in g.' })]);
  });

  it("skips blank lines and lines of bare delimiters without calling them rows", async () => {
    const result = await importFile("empty-lines.csv");
    expect(result.status.counts).toMatchObject({ total: 2, rejected: 0 });
  });

  it("reads units inside cells, refuses mixed units and digits beyond d", async () => {
    const result = await importFile("units-in-cells.csv", { mode: "valid_rows", unit: "kg" });
    expect(result.status.counts).toMatchObject({ total: 5, imported: 3, rejected: 2 });
    const rows = byTime(await checksOf(result.id));
    expect(rows.map((r) => r.unit)).toEqual(["g", "mg", "g"]);
    expect((await readingsOf([rows[0].id, rows[1].id])).map((r) => r.value)).toEqual(["100.0003", "200000.2"]);
    expect(result.report).toEqual([
      expect.objectContaining({ line: "5", column: "readings", reason: "The readings of one check must share one unit; this line has g and mg." }),
      expect.objectContaining({ line: "6", column: "readings", reason: "Reading 1: 200.00011 g has more decimals than this instrument shows (d allows 4 in g)." }),
    ]);
  });
});

describe("times without an offset", () => {
  it("are read in each instrument's site zone by default, across the change to summer time", async () => {
    const result = await importFile("times-without-zone.csv");
    expect(result.status.counts.imported).toBe(4);
    const rows = byTime(await checksOf(result.id));
    expect(rows.map((r) => [r.note, r.performedAt.toISOString()])).toEqual([
      ["London winter time", "2026-03-29T00:30:00.000Z"],
      ["Berlin winter time", "2026-03-29T00:30:00.000Z"],
      ["London summer time", "2026-03-29T01:30:00.000Z"],
      ["Berlin summer time", "2026-03-29T01:30:00.000Z"],
    ]);
  });

  it("are read in the zone chosen on the form when one is chosen", async () => {
    const result = await importFile("times-without-zone.csv", { timeZone: "America/Chicago" });
    const rows = byTime(await checksOf(result.id));
    expect(rows.map((r) => r.performedAt.toISOString())).toEqual(["2026-03-29T05:30:00.000Z", "2026-03-29T06:30:00.000Z", "2026-03-29T07:30:00.000Z", "2026-03-29T08:30:00.000Z"]);
  });
});
