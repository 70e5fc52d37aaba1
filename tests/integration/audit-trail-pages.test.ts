// The audit trail page, its CSV export, and corrections that keep the original check.
import { and, desc, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { writeAudit } from "../../app/queries/audit.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import * as auditExport from "../../app/routes/api/audit-export";
import * as audit from "../../app/routes/audit";
import * as correct from "../../app/routes/audit-correct-check";
import * as printCheck from "../../app/routes/print-check";
import { auditEvents, checkReadings, checks, instruments, users } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { ANALYST, METROLOGIST, SITE_MANAGER, TECHNICIAN } from "../helpers/people";

const cookies: Record<string, string> = {};
let checkId: number;

beforeAll(async () => {
  for (const email of [ANALYST, METROLOGIST, SITE_MANAGER, TECHNICIAN]) cookies[email] = await cookieFor(email);
  const [tomas] = await db().select().from(users).where(eq(users.email, TECHNICIAN));
  const [inst] = await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-PB-01"));
  const recorded = await recordCheck(db(), (await getViewer(db(), tomas.id))!, { instrument: { id: inst.id }, type: "repeatability", performedAt: new Date(Date.now() - 3600_000), unit: "g", readings: ["100.00", "100.01", "100.00", "100.01", "100.00", "100.01"], note: "=HYPERLINK(\"x\")", source: "form" });
  checkId = recorded.id;
});

describe("the audit trail", () => {
  it("filters by entity and person, with UTC and site-local times", async () => {
    const [tomas] = await db().select().from(users).where(eq(users.email, TECHNICIAN));
    const result = await run(audit.loader, request(`/audit?entity=check&actor=${tomas.id}`, { cookie: cookies[ANALYST] }));
    const rows = (result.body as { rows: { action: string; actor: string; utc: string; local: string | null }[] }).rows;
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.actor === "Tomas Varga-Lind")).toBe(true);
    expect(rows[0]).toMatchObject({ action: "check.record", local: expect.stringMatching(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2} AVP$/) });
  });

  it("is refused to a technician", async () => {
    expect((await run(audit.loader, request("/audit", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
    expect((await run(auditExport.loader, request("/api/v1/audit.csv", { cookie: cookies[TECHNICIAN] }))).status).toBe(403);
  });

  it("exports CSV that a spreadsheet cannot run as a formula, and records the export itself", async () => {
    await writeAudit(db(), { actorId: null, action: "test.formula", entityType: "check", entityId: "=1+1", siteId: (await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-PB-01")))[0].siteId });
    const response = (await auditExport.loader({ request: request("/api/v1/audit.csv?entity=check", { cookie: cookies[SITE_MANAGER] }), params: {}, context: {} } as never)) as Response;
    expect(response.headers.get("Content-Type")).toMatch(/^text\/csv/);
    const bytes = new Uint8Array(await response.arrayBuffer());
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]); // so spreadsheets read it as UTF-8
    const text = new TextDecoder().decode(bytes);
    expect(text.split("\r\n")[0]).toBe("event_id,chain_seq,at_utc,at_site_local,site,actor,actor_email,action,entity_type,entity_id,before_json,after_json,hash");
    expect(text).toContain("check.record");
    expect(text).toContain(",'=1+1,");
    expect(text).not.toContain(",=1+1,");
    const [exported] = await db().select().from(auditEvents).where(eq(auditEvents.action, "audit.export")).orderBy(desc(auditEvents.id)).limit(1);
    expect(exported.after).toMatchObject({ filter: { entity: "check" } });
  });
});

describe("corrections never overwrite", () => {
  it("a correction is a new check pointing at the original, which keeps its readings and gains only superseded_at", async () => {
    const [before] = await db().select().from(checks).where(eq(checks.id, checkId));
    const form = new URLSearchParams({ reason: "Reading 2 was mistyped: 100.01 read as 100.10." });
    for (const r of ["100.00", "100.10", "100.00", "100.01", "100.00", "100.01"]) form.append("readings", r);
    const result = await run(correct.action, request(`/checks/${checkId}/correct`, { method: "POST", cookie: cookies[TECHNICIAN], body: form, headers: { "Content-Type": "application/x-www-form-urlencoded" } }), { id: String(checkId) });
    expect(result.status).toBe(302);
    const [original] = await db().select().from(checks).where(eq(checks.id, checkId));
    const [corrected] = await db().select().from(checks).where(eq(checks.correctsCheckId, checkId));
    expect(original.supersededAt).not.toBeNull();
    expect({ ...original, supersededAt: null }).toEqual(before);
    expect(corrected).toMatchObject({ correctionReason: "Reading 2 was mistyped: 100.01 read as 100.10.", operatorId: before.operatorId, performedAt: before.performedAt });
    expect((await db().select().from(checkReadings).where(eq(checkReadings.checkId, checkId))).map((r) => r.value)).toEqual(["100.00", "100.01", "100.00", "100.01", "100.00", "100.01"]);
    const [event] = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "check.correct"), eq(auditEvents.entityId, String(checkId))));
    expect(event.after).toMatchObject({ reason: "Reading 2 was mistyped: 100.01 read as 100.10.", correctsCheckId: checkId });
    const record = await run(printCheck.loader, request(`/print/checks/${checkId}`, { cookie: cookies[ANALYST] }), { id: String(checkId) });
    expect(record.body).toMatchObject({ supersededBy: { id: corrected.id, reason: "Reading 2 was mistyped: 100.01 read as 100.10." } });
  });

  it("a second correction of the same original is refused", async () => {
    const form = new URLSearchParams({ reason: "Trying again." });
    form.append("readings", "100.02");
    form.append("readings", "100.03");
    const again = await run(correct.action, request(`/checks/${checkId}/correct`, { method: "POST", cookie: cookies[TECHNICIAN], body: form, headers: { "Content-Type": "application/x-www-form-urlencoded" } }), { id: String(checkId) });
    expect(again.status).toBe(409);
  });

  it("the database refuses to overwrite or delete a recorded check or its readings", async () => {
    const error = (p: Promise<unknown>) => p.then(() => "no error", (e: Error & { cause?: Error }) => String(e.cause?.message ?? e.message));
    expect(await error(db().execute(sql`update checks set result_g = 0 where id = ${checkId}`))).toMatch(/never overwritten/);
    expect(await error(db().execute(sql`update checks set superseded_at = now() where id = ${checkId}`))).toMatch(/never overwritten/);
    expect(await error(db().execute(sql`delete from checks where id = ${checkId}`))).toMatch(/never deleted/);
    expect(await error(db().execute(sql`update check_readings set value = '1' where check_id = ${checkId}`))).toMatch(/kept as entered/);
  });
});
