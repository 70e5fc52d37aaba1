// Check plans through their pages: the risk assessment stored with the plan, weights refused with reasons,
// the suggestion applied only on request, and the interval review approved or rejected with an audit event.
import { and, desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import * as planDetail from "../../app/routes/plans-detail";
import * as planNew from "../../app/routes/plans-new";
import * as plansList from "../../app/routes/plans";
import { auditEvents, checkPlans, checkPlanWeights, instruments, intervalReviewDecisions, seriesSummaries, sites, testWeights } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { ADMIN, METROLOGIST, SITE_MANAGER, TECHNICIAN } from "../helpers/people";

let instrumentId: number;
let weight10g: number;
let weight100g: number;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  for (const email of [ADMIN, METROLOGIST, SITE_MANAGER, TECHNICIAN]) cookies[email] = await cookieFor(email);
  const [avp] = await db().select().from(sites).where(eq(sites.code, "AVP"));
  const [inst] = await db().insert(instruments).values({ siteId: avp.id, assetTag: "AVP-AB-88", kind: "analytical_balance", capacityG: "220", readabilityG: "0.0001", verificationIntervalG: "0.001", accuracyClass: "I" }).returning();
  instrumentId = inst.id;
  [{ id: weight10g }] = await db().select().from(testWeights).where(eq(testWeights.identifier, "AVP-W-03"));
  [{ id: weight100g }] = await db().select().from(testWeights).where(eq(testWeights.identifier, "AVP-W-04"));
});

const planForm = (extra: Record<string, string> = {}) => ({ checkType: "sensitivity", consequence: "patient_safety", smallestNetWeightG: "0.5", processTolerancePercent: "0.1", intervalDays: "30", intervalReason: "Weekly use only.", toleranceBasis: "absolute", toleranceValue: "0.0003", guardBandPolicy: "fraction_of_tolerance", guardBandPercent: "33.33", safetyFactor: "2", ...extra });
const create = (email: string, form: Record<string, string>) => run(planNew.action, request(`/instruments/${instrumentId}/plans/new`, { cookie: cookies[email], form }), { id: String(instrumentId) });

describe("creating a plan from the risk assessment", () => {
  it("refuses a weight whose class mpe exceeds T/3, saying why, and saves nothing", async () => {
    const result = await create(METROLOGIST, { ...planForm(), weightIds: String(weight100g) });
    expect(result.status).toBe(400);
    expect(JSON.stringify(result.body)).toContain("AVP-W-04 may not serve this plan: The E2 class mpe (0.16 mg) is more than one third of the tolerance (0.1 mg).");
    expect(await db().select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId))).toHaveLength(0);
  });

  it("stores the plan with its weight, the assessment's reasoning and the chosen interval, not the suggested one", async () => {
    const result = await create(METROLOGIST, { ...planForm(), weightIds: String(weight10g) });
    expect(result.status).toBe(302);
    const [plan] = await db().select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId));
    expect(plan.intervalDays).toBe(30);
    expect(plan.riskAssessment).toMatchObject({ band: "high", suggestedIntervals: { sensitivity: 1 }, chosenIntervalDays: 30, intervalReason: "Weekly use only.", assessedBy: "Milo Ferrante" });
    expect((plan.riskAssessment as { reasoning: string[] }).reasoning.join(" ")).toMatch(/patient or consumer safety/);
    expect(await db().select().from(checkPlanWeights).where(eq(checkPlanWeights.planId, plan.id))).toEqual([{ planId: plan.id, weightId: weight10g }]);
    const planAudit = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "plan"), eq(auditEvents.entityId, String(plan.id))));
    expect(planAudit.map((a) => a.action)).toEqual(["plan.create"]);
    const [instrumentAudit] = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "instrument"), eq(auditEvents.entityId, String(instrumentId)), eq(auditEvents.action, "instrument.update")));
    expect(instrumentAudit).toMatchObject({ before: { smallestNetWeightG: null }, after: { smallestNetWeightG: "0.5" } });
    const [inst] = await db().select().from(instruments).where(eq(instruments.id, instrumentId));
    expect(inst).toMatchObject({ smallestNetWeightG: "0.5", processTolerancePercent: "0.1" });
  });

  it("a second plan of the same type is refused", async () => {
    const result = await create(METROLOGIST, { ...planForm(), weightIds: String(weight10g) });
    expect(result.status).toBe(400);
    expect(JSON.stringify(result.body)).toMatch(/already has a sensitivity plan/);
  });

  it("applies the suggested interval only when asked, with an audit event", async () => {
    const [plan] = await db().select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId));
    const result = await run(planDetail.action, request(`/plans/${plan.id}`, { cookie: cookies[METROLOGIST], form: { intent: "apply-suggestion" } }), { planId: String(plan.id) });
    expect(result.status).toBe(302);
    const [after] = await db().select().from(checkPlans).where(eq(checkPlans.id, plan.id));
    expect(after.intervalDays).toBe(1);
    const [audit] = await db().select().from(auditEvents).where(eq(auditEvents.action, "plan.apply_risk_suggestion")).orderBy(desc(auditEvents.id)).limit(1);
    expect(audit).toMatchObject({ before: { intervalDays: 30 }, after: { intervalDays: 1 } });
  });

  it.each([TECHNICIAN, SITE_MANAGER])("%s may not create or change a plan (403)", async (email) => {
    expect((await create(email, { ...planForm({ checkType: "repeatability" }) })).status).toBe(403);
    const [plan] = await db().select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId));
    expect((await run(planDetail.action, request(`/plans/${plan.id}`, { cookie: cookies[email], form: { intent: "apply-suggestion" } }), { planId: String(plan.id) })).status).toBe(403);
  });

  it("every role may read the programme", async () => {
    for (const email of [ADMIN, METROLOGIST, SITE_MANAGER, TECHNICIAN]) expect((await run(plansList.loader, request("/plans", { cookie: cookies[email] }))).status).toBe(200);
  });
});

describe("the engine's interval review, decided by a metrologist", () => {
  let planId: number;
  beforeAll(async () => {
    const [plan] = await db().select().from(checkPlans).where(eq(checkPlans.instrumentId, instrumentId));
    planId = plan.id;
    await db().update(checkPlans).set({ intervalDays: 8 }).where(eq(checkPlans.id, planId));
    await db().insert(seriesSummaries).values({ instrumentId, checkType: "sensitivity", review: { recommendation: "extend", reason: "The last 6 checks were within acceptance." } }).onConflictDoUpdate({ target: [seriesSummaries.instrumentId, seriesSummaries.checkType], set: { review: { recommendation: "extend", reason: "The last 6 checks were within acceptance." } } });
  });
  const decide = (email: string, form: Record<string, string>) => run(planDetail.action, request(`/plans/${planId}`, { cookie: cookies[email], form: { intent: "decide", ...form } }), { planId: String(planId) });

  it("shows the review and what approval would do", async () => {
    const page = await run(planDetail.loader, request(`/plans/${planId}`, { cookie: cookies[METROLOGIST] }), { planId: String(planId) });
    expect(page.body).toMatchObject({ review: { recommendation: "extend" }, proposed: 12, canDecide: true });
  });

  it("refuses a decision without a comment, a stale one, and one by an administrator (not a metrologist)", async () => {
    expect((await decide(METROLOGIST, { recommendation: "extend", decision: "approved", comment: "" })).status).toBe(400);
    expect((await decide(METROLOGIST, { recommendation: "shorten", decision: "approved", comment: "Looks fine to me." })).status).toBe(409);
    expect((await decide(ADMIN, { recommendation: "extend", decision: "approved", comment: "Looks fine to me." })).status).toBe(403);
    expect(await db().select().from(intervalReviewDecisions).where(eq(intervalReviewDecisions.planId, planId))).toHaveLength(0);
  });

  it("a rejection keeps the interval; an approval changes it; both are kept and audited", async () => {
    expect((await decide(METROLOGIST, { recommendation: "extend", decision: "rejected", comment: "Wait for the next calibration." })).status).toBe(302);
    expect((await db().select().from(checkPlans).where(eq(checkPlans.id, planId)))[0].intervalDays).toBe(8);
    expect((await decide(METROLOGIST, { recommendation: "extend", decision: "approved", comment: "Six clean checks; extend." })).status).toBe(302);
    expect((await db().select().from(checkPlans).where(eq(checkPlans.id, planId)))[0].intervalDays).toBe(12);
    const decisions = await db().select().from(intervalReviewDecisions).where(eq(intervalReviewDecisions.planId, planId)).orderBy(intervalReviewDecisions.id);
    expect(decisions.map((d) => [d.decision, d.previousIntervalDays, d.proposedIntervalDays, d.comment])).toEqual([
      ["rejected", 8, 12, "Wait for the next calibration."],
      ["approved", 8, 12, "Six clean checks; extend."],
    ]);
    const audits = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "plan"), eq(auditEvents.entityId, String(planId)))).orderBy(auditEvents.id);
    expect(audits.map((a) => a.action)).toEqual(expect.arrayContaining(["plan.interval_review.reject", "plan.interval_review.approve"]));
    expect(audits.find((a) => a.action === "plan.interval_review.approve")).toMatchObject({ before: { intervalDays: 8 }, after: { intervalDays: 12, comment: "Six clean checks; extend." } });
  });
});
