import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import * as training from "../../app/routes/training";
import { auditEvents, instruments, trainingRecords, users } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { METROLOGIST, SITE_MANAGER, TECHNICIAN } from "../helpers/people";

let tomasId: number;
const cookies: Record<string, string> = {};
type Site = { code: string; rows: { person: string; procedure: string; state: string }[] };

beforeAll(async () => {
  for (const email of [METROLOGIST, SITE_MANAGER, TECHNICIAN, "rhea.technician@quillmere.test"]) cookies[email] = await cookieFor(email);
  [{ id: tomasId }] = await db().select({ id: users.id }).from(users).where(eq(users.email, TECHNICIAN));
});

describe("training records", () => {
  it("lists expired and expiring records per site for the roles that may see them", async () => {
    const result = await run(training.loader, request("/training", { cookie: cookies[SITE_MANAGER] }));
    const qnw = (result.body as { sites: Site[] }).sites.find((s) => s.code === "QNW")!;
    expect(qnw.rows.find((r) => r.person === "Rhea Castellane" && r.procedure === "repeatability")?.state).toBe("expired");
  });

  it("a technician sees only their own records", async () => {
    const result = await run(training.loader, request("/training", { cookie: cookies[TECHNICIAN] }));
    const people = new Set((result.body as { sites: Site[] }).sites.flatMap((s) => s.rows.map((r) => r.person)));
    expect([...people]).toEqual(["Tomas Varga-Lind"]);
  });

  it("a metrologist records a custom procedure, audited; a site manager and a technician may not", async () => {
    const form = { userId: String(tomasId), procedure: "custom", customProcedure: "minimum weight determination", trainedOn: "2026-11-01", trainerName: "Milo Ferrante", expiresOn: "2027-11-01", evidence: "Observed practical." };
    expect((await run(training.action, request("/training", { cookie: cookies[METROLOGIST], form }))).status).toBe(200);
    const [row] = await db().select().from(trainingRecords).where(and(eq(trainingRecords.userId, tomasId), eq(trainingRecords.procedure, "minimum weight determination")));
    expect(row).toMatchObject({ trainerName: "Milo Ferrante", expiresOn: "2027-11-01" });
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "training"), eq(auditEvents.entityId, String(row.id))));
    expect(audit.action).toBe("training.record");
    for (const email of [SITE_MANAGER, TECHNICIAN]) expect((await run(training.action, request("/training", { cookie: cookies[email], form }))).status).toBe(403);
  });

  it("refuses an expiry before the training date with a field message", async () => {
    const result = await run(training.action, request("/training", { cookie: cookies[METROLOGIST], form: { userId: String(tomasId), procedure: "sensitivity", trainedOn: "2026-11-01", trainerName: "Milo Ferrante", expiresOn: "2026-10-01" } }));
    expect(result.status).toBe(400);
    expect(result.body).toMatchObject({ errors: { expiresOn: "The expiry date must come after the training date." } });
  });

  it("an expired record blocks that check; a new record lifts the block", async () => {
    const [rhea] = await db().select().from(users).where(eq(users.email, "rhea.technician@quillmere.test"));
    const viewer = (await getViewer(db(), rhea.id))!;
    const [inst] = await db().select().from(instruments).where(eq(instruments.assetTag, "QNW-PB-03"));
    const submission = { instrument: { id: inst.id }, type: "repeatability" as const, performedAt: new Date(), unit: "g" as const, readings: ["100.00", "100.01", "100.00", "100.00", "100.01", "100.00"], source: "form" as const };
    await expect(recordCheck(db(), viewer, submission)).rejects.toThrow(/no valid training record for the repeatability check procedure/);
    const today = new Date().toISOString().slice(0, 10);
    await run(training.action, request("/training", { cookie: cookies[METROLOGIST], form: { userId: String(rhea.id), procedure: "repeatability", trainedOn: today, trainerName: "Milo Ferrante", expiresOn: "2099-01-01" } }));
    await expect(recordCheck(db(), viewer, submission)).resolves.toMatchObject({ replayed: false });
  });
});
