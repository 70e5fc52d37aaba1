// The drift study, fleet and export endpoints against the seeded demo scenario, computed again by hand here.
import { and, asc, eq, gt } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { annotateCheck } from "../../app/queries/annotations.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import { listPlanSchedule } from "../../app/queries/schedule.server";
import type { InstrumentSeries } from "../../app/queries/series.server";
import type { FleetRow } from "../../app/queries/fleet-overview.server";
import * as exportCsv from "../../app/routes/api/export-checks";
import * as fleetApi from "../../app/routes/api/fleet";
import * as fleetHistory from "../../app/routes/api/fleet-history";
import * as seriesApi from "../../app/routes/api/instrument-series";
import { auditEvents, checks, instrumentEvents, instruments, users } from "../../db/schema";
import { ANALYST, METROLOGIST, SITE_MANAGER, TECHNICIAN } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";

const cookies: Record<string, string> = {};
const idOf: Record<string, number> = {};

beforeAll(async () => {
  for (const email of [METROLOGIST, SITE_MANAGER, TECHNICIAN, ANALYST]) cookies[email] = await cookieFor(email);
  for (const row of await db().select({ id: instruments.id, tag: instruments.assetTag }).from(instruments)) idOf[row.tag] = row.id;
});

const series = async (tag: string, query = "type=sensitivity&range=all", as = METROLOGIST) =>
  run(seriesApi.loader, request(`/api/v1/instruments/${idOf[tag]}/series?${query}`, { cookie: cookies[as] }), { id: String(idOf[tag]) });

describe("GET /api/v1/instruments/:id/series", () => {
  it("splits the drifting balance's history at its calibrations and computes each stage's limits from its own first 20 points", async () => {
    const result = await series("AVP-AB-01");
    expect(result.status).toBe(200);
    const body = result.body as InstrumentSeries;
    const [calibration] = await db().select().from(instrumentEvents).where(eq(instrumentEvents.instrumentId, idOf["AVP-AB-01"])).orderBy(asc(instrumentEvents.occurredAt)).then((rows) => rows.slice(-1));
    const stage = body.stages.at(-1)!;
    expect(new Date(stage.from).getTime()).toBe(calibration.occurredAt.getTime());
    // By hand: centre = mean of the first 20 results after the reset; σ̂ = mean moving range / 1.128 (d2 for n = 2,
    // Montgomery App. VI), never below 0.41·d (USP <41>).
    const first20 = (await db().select({ v: checks.resultG }).from(checks).where(and(eq(checks.instrumentId, idOf["AVP-AB-01"]), eq(checks.checkType, "sensitivity"), gt(checks.performedAt, calibration.occurredAt))).orderBy(asc(checks.performedAt)).limit(20)).map((r) => r.v);
    const centre = first20.reduce((a, b) => a + b, 0) / 20;
    const mr = first20.slice(1).reduce((a, v, i) => a + Math.abs(v - first20[i]), 0) / 19;
    const sigma = Math.max(mr / 1.128, 0.41 * 0.0001);
    expect(stage.baseline!.count).toBe(20);
    expect(stage.baseline!.center).toBeCloseTo(centre, 12);
    expect(stage.baseline!.sigma).toBeCloseTo(sigma, 12);
    expect(stage.limits!.ucl).toBeCloseTo(centre + 3 * sigma, 12);
    expect(stage.limits!.lwl).toBeCloseTo(centre - 2 * sigma, 12);
    expect(body.requirement).toMatchObject({ tolerance: 0.001, twoSided: true });
  });

  it("forecasts the drifting balance's crossing of the tolerance weeks ahead, and flags the drift with run rules", async () => {
    const body = (await series("AVP-AB-01")).body as InstrumentSeries;
    expect(body.trend!.slope).toBeGreaterThan(0);
    expect(body.trend!.pValue).toBeLessThan(0.05);
    const crossing = Date.parse(String(body.forecast!.toleranceAt));
    const now = Date.now();
    expect(crossing).toBeGreaterThan(now);
    expect(crossing - now).toBeLessThan(120 * 86_400_000);
    expect(body.signals.map((s) => s.rule)).toEqual(expect.arrayContaining(["nelson-2", "cusum-high"]));
    expect(body.points.some((p) => p.signals.length > 0)).toBe(true);
    expect(body.trendBand.length).toBeGreaterThan(2);
  });

  it("recomputes the limits at once when a metrologist excludes a baseline point, audited and reversible", async () => {
    const before = (await series("AVP-AB-02")).body as InstrumentSeries;
    const stage = before.stages.at(-1)!;
    const firstOfStage = before.points.find((p) => p.stage === stage.index)!;
    const viewer = (await getViewer(db(), (await db().select().from(users).where(eq(users.email, METROLOGIST)))[0].id))!;
    const inst = { instrumentId: idOf["AVP-AB-02"], siteId: (await db().select().from(instruments).where(eq(instruments.id, idOf["AVP-AB-02"])))[0].siteId };
    await annotateCheck(db(), viewer, { ...inst, checkId: firstOfStage.checkId, intent: "exclude", reason: "Weight dropped on the pan before reading" });
    const after = (await series("AVP-AB-02")).body as InstrumentSeries;
    expect(after.points.find((p) => p.checkId === firstOfStage.checkId)!.excluded).toBe(true);
    expect(after.stages.at(-1)!.baseline!.center).not.toBe(stage.baseline!.center);
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "check.exclude"), eq(auditEvents.entityId, String(firstOfStage.checkId))));
    expect(audit.after).toMatchObject({ excluded: true, reason: "Weight dropped on the pan before reading" });
    await annotateCheck(db(), viewer, { ...inst, checkId: firstOfStage.checkId, intent: "include", reason: "Reviewed: the reading was valid" });
    const restored = (await series("AVP-AB-02")).body as InstrumentSeries;
    expect(restored.stages.at(-1)!.baseline!.center).toBeCloseTo(stage.baseline!.center, 15);
  });

  it("answers 404 for another site's instrument, as the API does everywhere", async () => {
    expect((await series("LNT-AB-01")).status).toBe(404);
    expect((await series("LNT-AB-01", "type=sensitivity", SITE_MANAGER)).status).toBe(200);
  });
});

describe("GET /api/v1/fleet", () => {
  it("puts the drifting balance first when sorted by forecast, with its drift as a share of tolerance", async () => {
    const result = await run(fleetApi.loader, request("/api/v1/fleet?sort=forecast&dir=asc", { cookie: cookies[SITE_MANAGER] }));
    expect(result.status).toBe(200);
    const { rows, sites } = result.body as { rows: FleetRow[]; sites: { site: string; instruments: number }[] };
    expect(rows[0].assetTag).toBe("AVP-AB-01");
    expect(rows[0].driftPercentPer30Days).toBeGreaterThan(5);
    expect(rows.find((r) => r.assetTag === "LNT-PB-01")!.overdue).toBe(true);
    expect(sites.map((s) => s.site)).toEqual(["AVP", "LNT", "QNW"]);
    expect(sites.reduce((n, s) => n + s.instruments, 0)).toBe(rows.length);
  });

  it("counts overdue plans in the site's own days, exactly as the schedule does", async () => {
    const viewer = (await getViewer(db(), (await db().select().from(users).where(eq(users.email, SITE_MANAGER)))[0].id))!;
    const { rows, sites } = (await run(fleetApi.loader, request("/api/v1/fleet", { cookie: cookies[SITE_MANAGER] }))).body as { rows: FleetRow[]; sites: { site: string; overdue: number }[] };
    const schedule = await listPlanSchedule(db(), viewer, new Date());
    const overdue = (match: (p: (typeof schedule)[number]) => boolean) => schedule.filter((p) => match(p) && p.due.state === "overdue").length;
    expect(rows.some((r) => r.overdueChecks > 0)).toBe(true);
    for (const row of rows.filter((r) => r.status === "in_service")) expect({ tag: row.assetTag, overdue: row.overdueChecks }).toEqual({ tag: row.assetTag, overdue: overdue((p) => p.instrumentId === row.id) });
    for (const site of sites) expect({ site: site.site, overdue: site.overdue }).toEqual({ site: site.site, overdue: overdue((p) => p.siteCode === site.site) });
  });

  it("narrows the history to the instruments asked for, in their order, and never another site's", async () => {
    const ids = [idOf["QNW-PB-02"], idOf["AVP-AB-01"], idOf["LNT-AB-01"]];
    const result = await run(fleetHistory.loader, request(`/api/v1/fleet/history?ids=${ids.join(",")}`, { cookie: cookies[METROLOGIST] }));
    expect((result.body as { instruments: { assetTag: string }[] }).instruments.map((i) => i.assetTag)).toEqual(["QNW-PB-02", "AVP-AB-01"]);
    const bad = await run(fleetHistory.loader, request("/api/v1/fleet/history?ids=1,x", { cookie: cookies[METROLOGIST] }));
    expect(bad.status).toBe(400);
    expect((bad.body as { errors: { pointer: string }[] }).errors[0].pointer).toBe("/ids");
  });

  it("shows only the viewer's sites and refuses a technician", async () => {
    const mine = (await run(fleetApi.loader, request("/api/v1/fleet", { cookie: cookies[METROLOGIST] }))).body as { rows: FleetRow[] };
    expect(new Set(mine.rows.map((r) => r.siteCode))).toEqual(new Set(["AVP", "QNW"]));
    const history = (await run(fleetHistory.loader, request("/api/v1/fleet/history", { cookie: cookies[METROLOGIST] }))).body as { instruments: { siteCode: string }[]; weeks: string[] };
    expect(history.instruments.every((i) => i.siteCode !== "LNT")).toBe(true);
    expect(history.weeks).toHaveLength(12);
    expect((await run(fleetApi.loader, request("/api/v1/fleet", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });
});

describe("GET /api/v1/export/checks.csv", () => {
  it("streams the filtered rows with units in the header, neutralises formulas, keeps numbers numeric, and is audited", async () => {
    // A note typed by someone is the kind of cell a spreadsheet would run.
    const tomas = (await getViewer(db(), (await db().select().from(users).where(eq(users.email, TECHNICIAN)))[0].id))!;
    const check = await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-PB-01" }, type: "sensitivity", performedAt: new Date(Date.now() - 60_000), unit: "g", readings: ["5000.00"], note: '=HYPERLINK("http://example.invalid")', source: "form" });
    const result = await run(exportCsv.loader, request("/api/v1/export/checks.csv?instrument=AVP-PB-01&type=sensitivity", { cookie: cookies[ANALYST] }));
    expect(result.status).toBe(200);
    expect(result.headers.get("Content-Disposition")).toContain("checks_all-sites_AVP-PB-01_sensitivity.csv");
    const lines = String(result.body).trim().split("\r\n");
    expect(lines[0]).toBe("check_id,instrument,site,check_type,performed_at_utc,performed_at_site,site_time_zone,result_g,tolerance_g,acceptance_g,outcome,expanded_uncertainty_g,readings,readings_unit,weight,weight_conventional_mass_g,operator,source,excluded,note");
    const expected = await db().select({ id: checks.id }).from(checks).where(and(eq(checks.instrumentId, idOf["AVP-PB-01"]), eq(checks.checkType, "sensitivity")));
    expect(lines).toHaveLength(expected.length + 1);
    const first = lines.find((l) => l.startsWith(`${check.id},`))!;
    expect(first).toContain(`"'=HYPERLINK(""http://example.invalid"")"`);
    expect(first).toMatch(/,\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z,/);
    const negative = lines.find((l) => /,-\d/.test(l.split(",")[7] ? `,${l.split(",")[7]}` : ""));
    if (negative) expect(negative.split(",")[7]).not.toMatch(/^'/);
    const [audit] = await db().select().from(auditEvents).where(eq(auditEvents.action, "export.checks")).orderBy(asc(auditEvents.id)).then((rows) => rows.slice(-1));
    expect(audit.after).toMatchObject({ rows: expected.length, complete: true, filters: { instrument: "AVP-PB-01", type: "sensitivity" } });
  });

  it("exports only the viewer's sites and refuses a technician", async () => {
    const result = await run(exportCsv.loader, request("/api/v1/export/checks.csv?instrument=LNT-AB-01", { cookie: cookies[METROLOGIST] }));
    expect(String(result.body).trim().split("\r\n")).toHaveLength(1);
    expect((await run(exportCsv.loader, request("/api/v1/export/checks.csv", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });
});
