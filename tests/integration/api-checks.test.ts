// POST /api/v1/checks and GET /api/v1/checks through the real route, engine, database and SMTP fake.
import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { createApiToken } from "../../app/queries/people.server";
import * as apiChecks from "../../app/routes/api/checks";
import { auditEvents, checkReadings, checks, impactReviews, instruments, notifications, users } from "../../db/schema";
import { DEMO_PEOPLE } from "../../db/seed/people";
import { startOutbox } from "../helpers/mail";
import { TECHNICIAN } from "../helpers/people";
import { request, run } from "../helpers/routes";

let outbox: Awaited<ReturnType<typeof startOutbox>>;
const tokens: Record<string, string> = {};
const QNW_TECHNICIAN = DEMO_PEOPLE.find((p) => p.role === "technician" && p.siteCodes.includes("QNW"))!.email;

beforeAll(async () => {
  outbox = await startOutbox();
  for (const email of [TECHNICIAN, QNW_TECHNICIAN]) {
    const [user] = await db().select().from(users).where(eq(users.email, email));
    tokens[email] = (await db().transaction((tx) => createApiToken(tx, { userId: user.id, name: "test", createdById: null }))).secret;
  }
});
afterAll(async () => {
  await outbox.stop();
});

const post = (body: unknown, options: { key?: string; as?: string } = {}) =>
  run(
    apiChecks.action,
    request("/api/v1/checks", {
      method: "POST",
      body: typeof body === "string" ? body : JSON.stringify(body),
      headers: { Authorization: `Bearer ${tokens[options.as ?? TECHNICIAN]}`, "Content-Type": "application/json", ...(options.key ? { "Idempotency-Key": options.key } : {}) },
    }),
  );

const sensitivity = (tag: string, reading: number | string, at = "2026-11-30T07:45:00+01:00") => ({ instrument: tag, type: "sensitivity", performedAt: at, unit: "g", readings: [reading] });

describe("POST /api/v1/checks", () => {
  it("records a sensitivity check: 201, result judged on the server, readings kept exactly as entered, audited", async () => {
    const result = await post(sensitivity("AVP-AB-04", "200.0001"), { key: "k-sens-1" });
    expect(result.status).toBe(201);
    const body = result.body as { id: number; outcome: string; result: { value: number; tolerance: number }; uncertainty: { expanded: number }; instrumentStatus: string; signals: string[] };
    expect(body.outcome).toBe("in_tolerance");
    // USP <41>: 0.10 % of a 200 g weight → T = 0.2 g (REFERENCE.md §3)
    expect(body.result.tolerance).toBeCloseTo(0.2, 4);
    expect(Math.abs(body.result.value)).toBeLessThan(0.001);
    expect(body.uncertainty.expanded).toBeGreaterThan(0);
    expect(body.instrumentStatus).toBe("in_service");
    expect(body.signals).toEqual(expect.any(Array));
    const readings = await db().select().from(checkReadings).where(eq(checkReadings.checkId, body.id));
    expect(readings.map((r) => r.value)).toEqual(["200.0001"]);
    const audits = await db().select().from(auditEvents).where(and(eq(auditEvents.action, "check.record"), eq(auditEvents.entityId, String(body.id))));
    expect(audits).toHaveLength(1);
  });

  it("replays the same key with the same body as 200 with the same answer and no second row", async () => {
    const first = await post(sensitivity("AVP-AB-05", "200.0002"), { key: "k-replay" });
    const again = await post(sensitivity("AVP-AB-05", "200.0002"), { key: "k-replay" });
    expect(first.status).toBe(201);
    expect(again.status).toBe(200);
    expect((again.body as { id: number }).id).toBe((first.body as { id: number }).id);
    expect((again.body as { outcome: string }).outcome).toBe((first.body as { outcome: string }).outcome);
    const [{ n }] = await db().select({ n: count() }).from(checks).where(eq(checks.idempotencyKey, "k-replay"));
    expect(n).toBe(1);
  });

  it("answers 409 when a key is reused with another body", async () => {
    await post(sensitivity("AVP-AB-05", "200.0002", "2026-11-29T07:00:00Z"), { key: "k-conflict" });
    const other = await post(sensitivity("AVP-AB-05", "200.0003", "2026-11-29T07:00:00Z"), { key: "k-conflict" });
    expect(other.status).toBe(409);
    expect(other.headers.get("Content-Type")).toBe("application/problem+json");
  });

  it("takes an out-of-tolerance instrument out of service, opens an impact review and mails the metrologist", async () => {
    await post(sensitivity("AVP-AB-06", "200.0001", "2026-11-30T05:00:00Z"));
    const result = await post(sensitivity("AVP-AB-06", "200.5000"), { key: "k-fail" });
    expect(result.status).toBe(201);
    const body = result.body as { id: number; outcome: string; instrumentStatus: string };
    expect(body).toMatchObject({ outcome: "out_of_tolerance", instrumentStatus: "out_of_service" });
    const [inst] = await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-AB-06"));
    expect(inst.status).toBe("out_of_service");
    const [review] = await db().select().from(impactReviews).where(eq(impactReviews.failedCheckId, body.id));
    // The good check at 05:00 UTC and the failure at 06:45 UTC: one check in question, on one day of use.
    expect(review).toMatchObject({ checksSince: 1, daysOfUse: 1 });
    const sent = await db().select().from(notifications).where(eq(notifications.instrumentId, inst.id));
    expect(sent.length).toBeGreaterThan(0);
    expect(sent.every((n) => n.sentAt !== null)).toBe(true);
    expect(outbox.messages().some((m) => m.includes("AVP-AB-06 is out of service"))).toBe(true);
    const refused = await post(sensitivity("AVP-AB-06", "200.0001"));
    expect(refused.status).toBe(422);
    expect(JSON.stringify(refused.body)).toMatch(/out of service until a metrologist releases it/);
  });

  it("records repeatability from 10 readings with the USP <41> minimum weight", async () => {
    const readings = ["10.0001", "10.0002", "10.0001", "10.0000", "10.0002", "10.0001", "10.0001", "10.0002", "10.0000", "10.0001"];
    const result = await post({ instrument: "AVP-AB-05", type: "repeatability", performedAt: "2026-11-30T09:00:00Z", unit: "g", readings });
    expect(result.status).toBe(201);
    // s = 0.0000738 g here, above the floor 0.41·d = 0.000041 g, so s_eff = s and m_min = 2000·s = 0.148 g (USP <41>);
    // with the smallest net weight of 0.5 g, T = 0.5 g / 2000 = 0.00025 g and A = T/SF = 0.000125 g: within acceptance.
    expect((result.body as { outcome: string }).outcome).toBe("in_tolerance");
    const [row] = await db().select().from(checks).where(eq(checks.id, (result.body as { id: number }).id));
    const details = row.details as { s: number; sEffective: number; minimumWeightG: number };
    expect(details.sEffective).toBeCloseTo(details.s, 12);
    expect(details.minimumWeightG).toBeCloseTo(2000 * details.s, 10);
  });

  it("records eccentricity from the five positions", async () => {
    const readings = { centre: "200.0000", "front-left": "200.0002", "back-left": "199.9999", "back-right": "200.0001", "front-right": "200.0003" };
    const result = await post({ instrument: "AVP-AB-04", type: "eccentricity", performedAt: "2026-11-30T09:30:00Z", unit: "g", readings });
    expect(result.status).toBe(201);
    expect((result.body as { result: { value: number } }).result.value).toBeCloseTo(0.0003, 9);
  });

  it.each([
    ["an unknown check type", { ...sensitivity("AVP-AB-04", 200), type: "linearity" }, 422, "/type"],
    ["no instrument", { type: "sensitivity", performedAt: "2026-11-30T07:45:00Z", unit: "g", readings: [200] }, 422, "/instrument"],
    ["a time without an offset", sensitivity("AVP-AB-04", 200, "2026-11-30T07:45:00"), 422, "/performedAt"],
    ["more decimals than d", sensitivity("AVP-AB-04", "200.00001"), 422, "/readings/0"],
    ["a reading that is not a number", sensitivity("AVP-AB-04", "two hundred"), 422, "/readings/0"],
    ["a time in the future", sensitivity("AVP-AB-04", 200, "2099-01-01T00:00:00Z"), 422, "/performedAt"],
    ["an unknown weight", { ...sensitivity("AVP-AB-04", 200), weight: "NO-SUCH-W" }, 422, "/weight"],
  ])("refuses %s as problem+json with a pointer, storing nothing", async (_case, body, status, pointer) => {
    const [{ before }] = await db().select({ before: count() }).from(checks);
    const result = await post(body);
    expect(result.status).toBe(status);
    expect(result.headers.get("Content-Type")).toBe("application/problem+json");
    expect((result.body as { errors: { pointer: string }[] }).errors.map((e) => e.pointer)).toContain(pointer);
    const [{ after }] = await db().select({ after: count() }).from(checks);
    expect(after).toBe(before);
  });

  it("refuses another site's instrument with 404", async () => {
    const result = await post(sensitivity("QNW-AB-01", 200));
    expect(result.status).toBe(404);
  });

  it("refuses a person whose training on the procedure has expired", async () => {
    const readings = Array.from({ length: 10 }, () => "100.00");
    const result = await post({ instrument: "QNW-PB-01", type: "repeatability", performedAt: "2026-11-30T09:00:00Z", unit: "g", readings }, { as: QNW_TECHNICIAN });
    expect(result.status).toBe(403);
    expect(JSON.stringify(result.body)).toMatch(/no valid training record for the repeatability/);
  });
});

describe("GET /api/v1/checks", () => {
  it("lists the visible checks oldest first with a cursor", async () => {
    const auth = { Authorization: `Bearer ${tokens[TECHNICIAN]}` };
    const first = await run(apiChecks.loader, request("/api/v1/checks?instrument=AVP-AB-04&limit=1", { headers: auth }));
    expect(first.status).toBe(200);
    const page1 = first.body as { checks: { id: number; performedAt: string }[]; nextCursor: string | null };
    expect(page1.checks).toHaveLength(1);
    expect(page1.nextCursor).not.toBeNull();
    const second = await run(apiChecks.loader, request(`/api/v1/checks?instrument=AVP-AB-04&limit=1&cursor=${page1.nextCursor}`, { headers: auth }));
    const page2 = second.body as { checks: { id: number }[] };
    expect(page2.checks.length).toBeGreaterThan(0);
    expect(page2.checks.map((c) => c.id)).not.toContain(page1.checks[0].id);
    const other = await run(apiChecks.loader, request("/api/v1/checks?instrument=QNW-AB-01", { headers: auth }));
    expect((other.body as { checks: unknown[] }).checks).toHaveLength(0);
  });
});
