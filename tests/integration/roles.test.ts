// The role table of the foundation issue, one allowed and one refused case per capability that exists now.
import { and, desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import * as admin from "../../app/routes/admin";
import * as auditPage from "../../app/routes/audit";
import * as planNew from "../../app/routes/plans-new";
import * as schedulePage from "../../app/routes/schedule";
import * as trainingPage from "../../app/routes/training";
import * as weightNew from "../../app/routes/weights-new";
import * as checksDue from "../../app/routes/checks-due";
import * as fleet from "../../app/routes/fleet";
import * as instrumentDetail from "../../app/routes/instrument-detail";
import * as instrumentEdit from "../../app/routes/instrument-edit";
import * as instrumentNew from "../../app/routes/instrument-new";
import * as instruments from "../../app/routes/instruments";
import * as importsPage from "../../app/routes/imports";
import { auditEvents, instruments as instrumentsTable, sites } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { ADMIN, ANALYST, METROLOGIST, SITE_MANAGER, TECHNICIAN } from "../helpers/people";

const cookies: Record<string, string> = {};
let avpSiteId: number;
let lntInstrumentId: number;
let avpInstrumentId: number;

const newInstrumentForm = (assetTag: string) => ({
  assetTag,
  siteId: String(avpSiteId),
  kind: "analytical_balance",
  unit: "g",
  capacity: "220",
  readability: "0.0001",
  verificationInterval: "0.001",
  accuracyClass: "I",
  riskLevel: "high",
  smallestNetWeightUnit: "g",
});

beforeAll(async () => {
  for (const email of [ADMIN, METROLOGIST, SITE_MANAGER, TECHNICIAN, ANALYST]) cookies[email] = await cookieFor(email);
  const [avp] = await db().select().from(sites).where(eq(sites.code, "AVP"));
  avpSiteId = avp.id;
  const [lnt] = await db().select().from(instrumentsTable).innerJoin(sites, eq(sites.id, instrumentsTable.siteId)).where(eq(sites.code, "LNT")).limit(1);
  lntInstrumentId = lnt.instruments.id;
  const [avpInstrument] = await db().select().from(instrumentsTable).where(eq(instrumentsTable.siteId, avpSiteId)).limit(1);
  avpInstrumentId = avpInstrument.id;
});

describe("view instruments (every role, own sites)", () => {
  it.each([ADMIN, METROLOGIST, SITE_MANAGER, TECHNICIAN, ANALYST])("%s sees the register", async (email) => {
    const result = await run(instruments.loader, request("/instruments", { cookie: cookies[email] }));
    expect(result.status).toBe(200);
    expect((result.body as { page: { total: number } }).page.total).toBeGreaterThan(0);
  });

  it("someone not signed in is sent to sign-in", async () => {
    const result = await run(instruments.loader, request("/instruments"));
    expect(result.status).toBe(302);
    expect(result.headers.get("Location")).toMatch(/^\/login\?redirectTo=/);
  });

  it("a technician at one site sees only that site's instruments; an admin sees every site", async () => {
    const tech = await run(instruments.loader, request("/instruments?perPage=200", { cookie: cookies[TECHNICIAN] }));
    const rows = (tech.body as { page: { rows: { siteCode: string }[] } }).page.rows;
    expect(new Set(rows.map((r) => r.siteCode))).toEqual(new Set(["AVP"]));
    const all = await run(instruments.loader, request("/instruments?perPage=200", { cookie: cookies[ADMIN] }));
    expect(new Set((all.body as { page: { rows: { siteCode: string }[] } }).page.rows.map((r) => r.siteCode))).toEqual(new Set(["AVP", "QNW", "LNT"]));
  });

  it("another site's instrument is a 404 for a non-admin, so its existence does not leak", async () => {
    const result = await run(instrumentDetail.loader, request(`/instruments/${lntInstrumentId}`, { cookie: cookies[METROLOGIST] }), { id: String(lntInstrumentId) });
    expect(result.status).toBe(404);
    const missing = await run(instrumentDetail.loader, request("/instruments/999999", { cookie: cookies[METROLOGIST] }), { id: "999999" });
    expect(missing.status).toBe(404);
    const asAdmin = await run(instrumentDetail.loader, request(`/instruments/${lntInstrumentId}`, { cookie: cookies[ADMIN] }), { id: String(lntInstrumentId) });
    expect(asAdmin.status).toBe(200);
  });
});

describe("create and edit instruments (admin, metrologist)", () => {
  it.each([
    [METROLOGIST, "AVP-AB-90"],
    [ADMIN, "AVP-AB-91"],
  ])("%s registers an instrument, with an audit event in the same transaction", async (email, tag) => {
    const result = await run(instrumentNew.action, request("/instruments/new", { cookie: cookies[email], form: newInstrumentForm(tag) }));
    expect(result.status).toBe(302);
    const [row] = await db().select().from(instrumentsTable).where(eq(instrumentsTable.assetTag, tag));
    expect(row.capacityG).toBe("220");
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "instrument"), eq(auditEvents.entityId, String(row.id))));
    expect(audit.action).toBe("instrument.create");
  });

  it.each([TECHNICIAN, SITE_MANAGER, ANALYST])("%s is refused with 403, and nothing is saved", async (email) => {
    const tag = `AVP-X-${email.slice(0, 4)}`;
    const result = await run(instrumentNew.action, request("/instruments/new", { cookie: cookies[email], form: newInstrumentForm(tag) }));
    expect(result.status).toBe(403);
    expect(await db().select().from(instrumentsTable).where(eq(instrumentsTable.assetTag, tag))).toHaveLength(0);
  });

  it("a technician's direct POST to the edit action is refused with 403", async () => {
    const result = await run(instrumentEdit.action, request(`/instruments/${avpInstrumentId}/edit`, { cookie: cookies[TECHNICIAN], form: newInstrumentForm("AVP-HACK") }), { id: String(avpInstrumentId) });
    expect(result.status).toBe(403);
    const page = await run(instrumentEdit.loader, request(`/instruments/${avpInstrumentId}/edit`, { cookie: cookies[TECHNICIAN] }), { id: String(avpInstrumentId) });
    expect(page.status).toBe(403);
  });

  it("invalid input comes back as 400 with field messages; nothing is saved or audited", async () => {
    const before = await db().select().from(auditEvents);
    const result = await run(instrumentNew.action, request("/instruments/new", { cookie: cookies[METROLOGIST], form: { ...newInstrumentForm("AVP-BAD-1"), readability: "0.01", verificationInterval: "0.001" } }));
    expect(result.status).toBe(400);
    expect(JSON.stringify(result.body)).toMatch(/d must not exceed e/);
    expect(await db().select().from(instrumentsTable).where(eq(instrumentsTable.assetTag, "AVP-BAD-1"))).toHaveLength(0);
    expect(await db().select().from(auditEvents)).toHaveLength(before.length);
  });

  it("an edit keeps before and after in the audit trail", async () => {
    const [current] = await db().select().from(instrumentsTable).where(eq(instrumentsTable.id, avpInstrumentId));
    const form = { ...newInstrumentForm(current.assetTag), kind: current.kind, capacity: current.capacityG, readability: current.readabilityG, verificationInterval: current.verificationIntervalG, accuracyClass: current.accuracyClass ?? "none", description: "Renamed in a test" };
    const result = await run(instrumentEdit.action, request(`/instruments/${avpInstrumentId}/edit`, { cookie: cookies[METROLOGIST], form }), { id: String(avpInstrumentId) });
    expect(result.status).toBe(302);
    const [audit] = await db().select().from(auditEvents).where(eq(auditEvents.action, "instrument.update")).orderBy(desc(auditEvents.id)).limit(1);
    expect((audit.before as { description: string }).description).toBe(current.description);
    expect((audit.after as { description: string }).description).toBe("Renamed in a test");
  });

  it("a metrologist cannot create an instrument at a site where they have no role", async () => {
    const [lnt] = await db().select().from(sites).where(eq(sites.code, "LNT"));
    const result = await run(instrumentNew.action, request("/instruments/new", { cookie: cookies[METROLOGIST], form: { ...newInstrumentForm("LNT-AB-99"), siteId: String(lnt.id) } }));
    expect(result.status).toBe(403);
  });
});

describe("record a check (metrologist, technician): the due list", () => {
  it("a technician sees the checks due at their site", async () => {
    const result = await run(checksDue.loader, request("/checks-due", { cookie: cookies[TECHNICIAN] }));
    expect(result.status).toBe(200);
    expect((result.body as { due: unknown[] }).due.length).toBeGreaterThan(0);
  });
  it("an analyst is refused", async () => {
    expect((await run(checksDue.loader, request("/checks-due", { cookie: cookies[ANALYST] }))).status).toBe(403);
  });
});

describe("fleet comparison (site manager and the roles that may read the audit trail)", () => {
  it("a site manager sees the fleet", async () => {
    expect((await run(fleet.loader, request("/fleet", { cookie: cookies[SITE_MANAGER] }))).status).toBe(200);
  });
  it("a technician is refused", async () => {
    expect((await run(fleet.loader, request("/fleet", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });
});

describe("users, memberships and API tokens (admin)", () => {
  it("an admin sees people and tokens", async () => {
    const result = await run(admin.loader, request("/admin", { cookie: cookies[ADMIN] }));
    expect(result.status).toBe(200);
    expect((result.body as { people: unknown[] }).people.length).toBeGreaterThanOrEqual(6);
  });
  it.each([METROLOGIST, SITE_MANAGER, TECHNICIAN, ANALYST])("%s is refused", async (email) => {
    expect((await run(admin.loader, request("/admin", { cookie: cookies[email] }))).status).toBe(403);
    expect((await run(admin.action, request("/admin", { cookie: cookies[email], form: { intent: "create-token", userId: "1", name: "sneaky" } }))).status).toBe(403);
  });
});

describe("programme pages (issue 6): plans, weights, training, schedule, audit trail", () => {
  it("a metrologist may open the new-plan page; a technician is refused", async () => {
    const path = `/instruments/${avpInstrumentId}/plans/new`;
    expect((await run(planNew.loader, request(path, { cookie: cookies[METROLOGIST] }), { id: String(avpInstrumentId) })).status).toBe(200);
    expect((await run(planNew.loader, request(path, { cookie: cookies[TECHNICIAN] }), { id: String(avpInstrumentId) })).status).toBe(403);
  });
  it("an admin may register a test weight; an analyst is refused", async () => {
    expect((await run(weightNew.loader, request("/weights/new", { cookie: cookies[ADMIN] }))).status).toBe(200);
    expect((await run(weightNew.loader, request("/weights/new", { cookie: cookies[ANALYST] }))).status).toBe(403);
  });
  it("a metrologist may record training; a site manager may only read it", async () => {
    expect((await run(trainingPage.loader, request("/training", { cookie: cookies[SITE_MANAGER] }))).status).toBe(200);
    expect((await run(trainingPage.action, request("/training", { cookie: cookies[SITE_MANAGER], form: { userId: "1", procedure: "sensitivity" } }))).status).toBe(403);
  });
  it("a site manager sees the schedule and the audit trail; a technician may not read the audit trail", async () => {
    expect((await run(schedulePage.loader, request("/schedule", { cookie: cookies[SITE_MANAGER] }))).status).toBe(200);
    expect((await run(auditPage.loader, request("/audit", { cookie: cookies[SITE_MANAGER] }))).status).toBe(200);
    expect((await run(auditPage.loader, request("/audit", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });
});

describe("CSV import (admin, metrologist)", () => {
  it("a metrologist opens the imports page; a technician is refused", async () => {
    expect((await run(importsPage.loader, request("/imports", { cookie: cookies[METROLOGIST] }))).status).toBe(200);
    expect((await run(importsPage.loader, request("/imports", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });
});
