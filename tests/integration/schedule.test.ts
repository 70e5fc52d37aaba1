// Due and overdue per plan from the last valid check, in each site's own calendar, through the real queries and pages.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import * as checksDue from "../../app/routes/checks-due";
import { listPlanSchedule } from "../../app/queries/schedule.server";
import { checkPlans, checks, instruments, pointAnnotations, sites, users } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { METROLOGIST, TECHNICIAN } from "../helpers/people";

let operatorId: number;

async function instrumentWithDailyPlan(siteCode: string, tag: string, intervalDays = 1) {
  const [site] = await db().select().from(sites).where(eq(sites.code, siteCode));
  const [inst] = await db().insert(instruments).values({ siteId: site.id, assetTag: tag, kind: "analytical_balance", capacityG: "220", readabilityG: "0.0001", verificationIntervalG: "0.001", accuracyClass: "I" }).returning();
  const [plan] = await db().insert(checkPlans).values({ instrumentId: inst.id, checkType: "sensitivity", intervalDays, toleranceBasis: "usp41", createdAt: new Date("2025-01-01T00:00:00Z") }).returning();
  return { inst, plan };
}

async function check(instrumentId: number, at: string, outcome: "in_tolerance" | "out_of_tolerance" = "in_tolerance") {
  const [row] = await db().insert(checks).values({ instrumentId, checkType: "sensitivity", operatorId, performedAt: new Date(at), unit: "g", resultG: 0, outcome, source: "form" }).returning();
  return row;
}

const dueOf = async (instrumentId: number, now: string) => (await listPlanSchedule(db(), null, new Date(now), { instrumentId }))[0].due;

beforeAll(async () => {
  [{ id: operatorId }] = await db().select({ id: users.id }).from(users).where(eq(users.email, METROLOGIST));
});

describe("due and overdue in the site's calendar", () => {
  it("a daily check done at 23:30 Berlin time on 31 January is due on 1 February and overdue from 2 February, Berlin time", async () => {
    const { inst } = await instrumentWithDailyPlan("QNW", "QNW-T-01");
    await check(inst.id, "2026-01-31T22:30:00Z");
    expect(await dueOf(inst.id, "2026-02-01T22:59:00Z")).toMatchObject({ dueOn: "2026-02-01", today: "2026-02-01", state: "due_today" });
    expect(await dueOf(inst.id, "2026-02-01T23:01:00Z")).toMatchObject({ today: "2026-02-02", state: "overdue", daysOverdue: 1 });
  });

  it("the same instant falls on 31 January in Chicago, so a Chicago plan is due a day earlier than UTC would say", async () => {
    const { inst } = await instrumentWithDailyPlan("LNT", "LNT-T-01");
    await check(inst.id, "2026-02-01T03:00:00Z"); // 21:00 on 31 January in Chicago
    expect(await dueOf(inst.id, "2026-02-01T23:30:00Z")).toMatchObject({ dueOn: "2026-02-01", today: "2026-02-01", state: "due_today" });
    expect(await dueOf(inst.id, "2026-02-02T06:30:00Z")).toMatchObject({ today: "2026-02-02", state: "overdue" });
  });

  it("a 30-day plan runs across the end of February and the March clock change by calendar days", async () => {
    const { inst } = await instrumentWithDailyPlan("AVP", "AVP-T-30", 30);
    await check(inst.id, "2026-02-14T10:00:00Z");
    expect(await dueOf(inst.id, "2026-03-16T12:00:00Z")).toMatchObject({ dueOn: "2026-03-16", state: "due_today" });
    expect(await dueOf(inst.id, "2026-03-10T12:00:00Z")).toMatchObject({ state: "due_this_week" });
    expect(await dueOf(inst.id, "2026-03-17T00:30:00Z")).toMatchObject({ state: "overdue", daysOverdue: 1 });
  });

  it("counts only valid checks: an out-of-tolerance, a corrected or an excluded check does not reset the clock", async () => {
    const { inst } = await instrumentWithDailyPlan("AVP", "AVP-T-02", 7);
    await check(inst.id, "2026-05-01T09:00:00Z");
    await check(inst.id, "2026-05-06T09:00:00Z", "out_of_tolerance");
    const corrected = await check(inst.id, "2026-05-07T09:00:00Z");
    await db().update(checks).set({ supersededAt: new Date("2026-05-07T10:00:00Z") }).where(eq(checks.id, corrected.id));
    const excluded = await check(inst.id, "2026-05-07T11:00:00Z");
    await db().insert(pointAnnotations).values({ checkId: excluded.id, excluded: true, reason: "Wrong weight used", createdById: operatorId });
    expect(await dueOf(inst.id, "2026-05-09T09:00:00Z")).toMatchObject({ dueOn: "2026-05-08", state: "overdue", daysOverdue: 1 });
  });

  it("a plan never checked is due from the day it was made, and shows on the technician's due-today list", async () => {
    const { inst, plan } = await instrumentWithDailyPlan("AVP", "AVP-T-NEW", 7);
    await db().update(checkPlans).set({ createdAt: new Date() }).where(eq(checkPlans.id, plan.id));
    const result = await run(checksDue.loader, request("/checks-due", { cookie: await cookieFor(TECHNICIAN) }));
    const row = (result.body as { due: { assetTag: string; due: { state: string; neverChecked: boolean } }[] }).due.find((d) => d.assetTag === inst.assetTag);
    expect(row?.due).toMatchObject({ state: "due_today", neverChecked: true });
  });

  it("an out-of-service instrument is not scheduled", async () => {
    const { inst } = await instrumentWithDailyPlan("AVP", "AVP-T-OOS");
    await db().update(instruments).set({ status: "out_of_service" }).where(eq(instruments.id, inst.id));
    expect(await listPlanSchedule(db(), null, new Date(), { instrumentId: inst.id })).toHaveLength(0);
  });
});
