// The import page's loader and action: preview and suggested mapping, a saved mapping, refused settings, and
// importing the valid rows of a file that was rejected as a whole.
import path from "node:path";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { waitForImport } from "../../app/queries/imports-job.server";
import * as page from "../../app/routes/imports-detail";
import type { ImportStatusResponse } from "../../app/routes/api/imports-status";
import { auditEvents, importMappings } from "../../db/schema";
import { METROLOGIST } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";
import { checksOf, FIXTURES, importFile, status, upload } from "./import-helpers";

interface MappingData {
  labels: string[];
  rows: string[][];
  suggested: Record<string, string>;
  read: { encoding: string; delimiter: string };
  siteZones: { code: string; timeZone: string }[];
}

async function uploaded(file: string) {
  const result = await upload(path.join(FIXTURES, file));
  return (result.body as ImportStatusResponse).id;
}

const load = async (id: number, search = "") => run(page.loader, request(`/imports/${id}${search}`, { cookie: await cookieFor(METROLOGIST) }), { id: String(id) });
const submit = async (id: number, form: Record<string, string>) => run(page.action, request(`/imports/${id}`, { cookie: await cookieFor(METROLOGIST), form }), { id: String(id) });

/** The form as the mapping page posts it: one select per column, by position. */
function mappingForm(labels: string[], mapping: Record<string, string>, extra: Record<string, string> = {}) {
  return { intent: "start", unit: "g", timeZone: "site", mode: "all_or_nothing", ...Object.fromEntries(labels.map((l, i) => [`map:${i}`, mapping[l] ?? ""])), ...extra };
}

describe("the mapping page", () => {
  it("shows the header, the first rows, the suggested mapping and the zones of the importer's sites", async () => {
    const id = await uploaded("semicolon-decimal-comma.csv");
    const result = await load(id);
    expect(result.status).toBe(200);
    const mapping = (result.body as { mapping: MappingData }).mapping;
    expect(mapping.read).toEqual({ encoding: "utf-8", delimiter: ";" });
    expect(mapping.labels).toEqual(["asset_tag", "check_type", "performed_at", "unit", "weight", "readings", "operator_email", "note"]);
    expect(mapping.rows[0].slice(0, 3)).toEqual(["AVP-AB-04", "sensitivity", "2026-11-03 08:15"]);
    expect(mapping.suggested.readings).toBe("readings");
    expect(mapping.siteZones).toEqual([{ code: "AVP", timeZone: "Europe/London" }, { code: "QNW", timeZone: "Europe/Berlin" }]);
    const asComma = (await load(id, "?delimiter=%2C")).body as { mapping: MappingData };
    expect(asComma.mapping.labels).toEqual(["asset_tag;check_type;performed_at;unit;weight;readings;operator_email;note"]);
  });

  it("maps columns named differently, saves the mapping under a name, and imports", async () => {
    const id = await uploaded("times-without-zone.csv");
    const { labels } = ((await load(id)).body as { mapping: MappingData }).mapping;
    const mapping = { asset_tag: "asset_tag", check_type: "check_type", performed_at: "performed_at", weight: "weight", readings: "readings" };
    const result = await submit(id, mappingForm(labels, mapping, { saveAs: "Weighing-room log", timeZone: "UTC" }));
    expect(result.status).toBe(302);
    expect(result.headers.get("Location")).toBe(`/imports/${id}`);
    await waitForImport(id);
    expect((await status(id)).counts.imported).toBe(4);
    expect((await checksOf(id)).every((c) => c.note === "")).toBe(true);
    const [saved] = await db().select().from(importMappings).where(eq(importMappings.name, "Weighing-room log"));
    expect(saved.mapping).toEqual(mapping);
    const [audit] = await db().select().from(auditEvents).where(eq(auditEvents.entityType, "import_mapping"));
    expect(audit.action).toBe("import_mapping.create");
  });

  it("refuses a mapping without readings, with the field to map, and starts nothing", async () => {
    const id = await uploaded("utf8-bom.csv");
    const { labels, suggested } = ((await load(id)).body as { mapping: MappingData }).mapping;
    const { readings: _dropped, ...rest } = suggested;
    const result = await submit(id, mappingForm(labels, rest));
    expect(result.status).toBe(400);
    expect((result.body as { errors: string[] }).errors).toEqual(["Map a column to Readings."]);
    expect((await status(id)).status).toBe("mapping");
  });

  it("after an all-or-nothing rejection, imports only the valid rows on request and keeps the report", async () => {
    const rejected = await importFile("rule-refusals.csv");
    expect(rejected.status).toMatchObject({ status: "rejected", canImportValidRows: true });
    const result = await submit(rejected.id, { intent: "import-valid-rows" });
    expect(result.status).toBe(302);
    await waitForImport(rejected.id);
    const after = await status(rejected.id);
    expect(after).toMatchObject({ status: "done", mode: "valid_rows", counts: { imported: 1, rejected: 4 } });
    expect(after.reportUrl).toBe(`/api/v1/imports/${rejected.id}/report.csv`);
  });
});
