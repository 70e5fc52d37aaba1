import { parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useSearchParams } from "react-router";
import { z } from "zod";
import { CHECK_TYPE_LABELS, DueBadge } from "~/components/plans/due-badge";
import { formWeights, planDefaults } from "~/components/plans/plan-defaults";
import { PlanForm } from "~/components/plans/plan-form";
import { PlanFormSchema, TOLERANCE_BASIS_LABELS } from "~/components/plans/plan-form-schema";
import { RiskPanel } from "~/components/plans/risk-panel";
import { SuitabilityTable } from "~/components/plans/suitability-table";
import { Button } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { proposedIntervalDays } from "~/lib/risk";
import { localDate, localDateTime } from "~/lib/schedule";
import { applyRiskSuggestion, decideIntervalReview, getPlan, measuredMinimumWeight, savePlan, siteWeights, StaleReview, type StoredRiskAssessment } from "~/queries/plans.server";
import { listPlanSchedule } from "~/queries/schedule.server";
import { suitabilityForPlan } from "~/queries/weights-suitability.server";
import type { Route } from "./+types/plans-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data ? `${CHECK_TYPE_LABELS[data.plan.checkType]} plan · ${data.instrument.assetTag}` : "Check plan"} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const page = await getPlan(db(), viewer, Number(params.planId));
  const now = new Date();
  const today = localDate(now, page.instrument.siteTimeZone);
  const [weights, measured, schedule] = await Promise.all([siteWeights(db(), page.instrument.siteId), measuredMinimumWeight(db(), page.plan.instrumentId), listPlanSchedule(db(), viewer, now, { instrumentId: page.plan.instrumentId })]);
  const suitability = page.weights.map((w) => ({ weightId: w.id, identifier: w.identifier, weightClass: w.weightClass, nominalG: w.nominalG, ...suitabilityForPlan(page.plan, page.instrumentRow, w, today) }));
  const canEdit = can(viewer, "manage_instruments", page.instrument.siteId);
  return {
    ...page,
    risk: page.plan.riskAssessment as StoredRiskAssessment | null,
    due: schedule.find((s) => s.planId === page.plan.id)?.due ?? null,
    proposed: page.review ? proposedIntervalDays(page.review.recommendation, page.plan.intervalDays) : null,
    suitability,
    decisions: page.decisions.map((d) => ({ ...d.decision, by: d.by, decidedLocal: localDateTime(d.decision.decidedAt, page.instrument.siteTimeZone) })),
    defaults: canEdit ? planDefaults(page.instrumentRow, page.plan, page.weights.map((w) => w.id)) : null,
    formWeights: canEdit ? formWeights(weights, today) : [],
    measured,
    canEdit,
    canDecide: can(viewer, "review_points", page.instrument.siteId),
  };
}

const DecisionSchema = z.object({
  recommendation: z.enum(["extend", "keep", "shorten"]),
  decision: z.enum(["approved", "rejected"]),
  comment: z.string().trim().min(5, "Write a comment for the record (at least a few words)."),
});

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const page = await getPlan(db(), viewer, Number(params.planId));
  const siteId = page.instrument.siteId;
  const form = await request.formData();
  const intent = String(form.get("intent") ?? "save");
  if (intent === "decide") {
    if (!can(viewer, "review_points", siteId)) throw forbiddenPage("Only a metrologist approves or rejects an interval review.");
    const parsed = DecisionSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return data({ decisionErrors: parsed.error.issues.map((i) => i.message) }, { status: 400 });
    try {
      await decideIntervalReview(db(), viewer, { planId: page.plan.id, siteId, ...parsed.data });
    } catch (error) {
      if (error instanceof StaleReview) return data({ decisionErrors: [error.message] }, { status: 409 });
      throw error;
    }
    return redirect(`/plans/${page.plan.id}?decided=${parsed.data.decision}`);
  }
  if (!can(viewer, "manage_instruments", siteId)) throw forbiddenPage("Only a metrologist or an administrator changes check plans.");
  if (intent === "apply-suggestion") {
    const applied = await applyRiskSuggestion(db(), viewer, { planId: page.plan.id, siteId });
    if (!applied) return data({ decisionErrors: ["The stored risk assessment suggests no interval for this check type."] }, { status: 409 });
    return redirect(`/plans/${page.plan.id}?saved=1`);
  }
  const submission = parseWithZod(form, { schema: PlanFormSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  const saved = await savePlan(db(), viewer, { instrument: page.instrumentRow, planId: page.plan.id, form: submission.value, today: localDate(new Date(), page.instrument.siteTimeZone) });
  if (!saved.ok) return data(submission.reply({ fieldErrors: saved.fieldErrors }), { status: 400 });
  return redirect(`/plans/${page.plan.id}?saved=1`);
}

const REVIEW_WORDS = { extend: "Extend the interval", keep: "Keep the interval", shorten: "Shorten the interval" } as const;

export default function PlanDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { plan, instrument, instrumentRow, review, proposed, risk, due, suitability, decisions, defaults, formWeights, measured, canEdit, canDecide } = loaderData;
  const [search] = useSearchParams();
  const decisionErrors = actionData && "decisionErrors" in actionData ? actionData.decisionErrors : [];
  const formResult = actionData && "status" in actionData ? actionData : undefined;
  const suggested = risk?.suggestedIntervals?.[plan.checkType];
  return (
    <>
      <PageHeader
        title={`${CHECK_TYPE_LABELS[plan.checkType]} plan · ${instrument.assetTag}`}
        subtitle={<span className="inline-flex flex-wrap items-center gap-3">Every {plan.intervalDays === 1 ? "day" : `${plan.intervalDays} days`} · {TOLERANCE_BASIS_LABELS[plan.toleranceBasis]}{due ? <><DueBadge state={due.state} daysOverdue={due.daysOverdue} /> <span className="num">next due {due.dueOn}</span></> : null}</span>}
        action={<Link to={`/instruments/${instrument.id}/plans`} className="text-sm text-accent underline">All plans of {instrument.assetTag}</Link>}
      />
      {search.get("saved") ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">Plan saved. The change and its before and after are in the audit trail.</p> : null}
      {search.get("decided") ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">Interval review {search.get("decided")}. The decision is in the audit trail.</p> : null}
      <div className="grid gap-6 xl:grid-cols-2">
        <section aria-labelledby="review-heading" className="rounded-md border border-rule bg-card p-4">
          <h2 id="review-heading" className="font-semibold">Interval review</h2>
          {review ? (
            <>
              <p className="mt-2 text-sm"><strong>{REVIEW_WORDS[review.recommendation]}</strong>{proposed !== null && proposed !== plan.intervalDays ? <> : <span className="num">{plan.intervalDays} → {proposed} days</span> if approved</> : null}.</p>
              <p className="mt-1 text-sm text-ink-soft">{review.reason}</p>
              {canDecide ? (
                <Form method="post" className="mt-3 grid gap-2 text-sm">
                  <input type="hidden" name="intent" value="decide" />
                  <input type="hidden" name="recommendation" value={review.recommendation} />
                  <label htmlFor="review-comment" className="font-medium">Comment for the record</label>
                  <textarea id="review-comment" name="comment" rows={2} required className="rounded-md border border-rule bg-card px-3 py-2" />
                  {decisionErrors.length ? <p role="alert" className="text-out">{decisionErrors.join(" ")}</p> : null}
                  <div className="flex gap-2">
                    <Button type="submit" name="decision" value="approved">Approve</Button>
                    <Button type="submit" name="decision" value="rejected" variant="secondary">Reject</Button>
                  </div>
                </Form>
              ) : null}
            </>
          ) : <p className="mt-2 text-sm text-ink-soft">No review yet: the engine reviews the interval once checks are recorded under this plan.</p>}
          {decisions.length ? (
            <table className="mt-4 w-full text-sm">
              <caption className="text-left font-medium">Decisions</caption>
              <tbody>
                {decisions.map((d) => (
                  <tr key={d.id} className="border-t border-rule/60 align-top">
                    <td className="num py-1 pr-3">{d.decidedLocal}</td>
                    <td className="py-1 pr-3">{d.decision === "approved" ? "Approved" : "Rejected"} {d.recommendation} ({d.previousIntervalDays} → {d.decision === "approved" ? d.proposedIntervalDays : d.previousIntervalDays} d)</td>
                    <td className="py-1">{d.by}: {d.comment}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : null}
        </section>
        <section aria-labelledby="weights-heading" className="rounded-md border border-rule bg-card p-4">
          <h2 id="weights-heading" className="mb-2 font-semibold">Test weights</h2>
          <SuitabilityTable rows={suitability} weightHref={(id) => `/weights/${id}`} />
        </section>
      </div>
      <div className="mt-6">
        {risk ? (
          <RiskPanel risk={risk} label="Stored risk assessment" title={`Risk assessment by ${risk.assessedBy} on ${risk.assessedAt.slice(0, 10)}`}>
            {risk.intervalReason ? <p className="mt-2">Why {risk.chosenIntervalDays === 1 ? "every day" : `every ${risk.chosenIntervalDays} days`}: {risk.intervalReason}</p> : null}
            {canEdit && suggested && suggested !== plan.intervalDays ? (
              <Form method="post" className="mt-3">
                <input type="hidden" name="intent" value="apply-suggestion" />
                <p className="mb-2">The plan checks every {plan.intervalDays} days; the assessment suggests {suggested}. Nothing changes unless you apply it.</p>
                <Button type="submit" variant="secondary">Apply the suggested {suggested}-day interval</Button>
              </Form>
            ) : null}
          </RiskPanel>
        ) : <p className="rounded-md border border-dashed border-rule p-4 text-sm text-ink-soft">No risk assessment is stored with this plan.{canEdit ? " Fill in the risk assessment below and save to keep one." : ""}</p>}
      </div>
      {canEdit && defaults ? (
        <section aria-labelledby="edit-heading" className="mt-8">
          <h2 id="edit-heading" className="mb-3 text-lg font-semibold">Change this plan</h2>
          <PlanForm lastResult={formResult} defaultValue={defaults} fixedType={plan.checkType} takenTypes={[]} instrument={instrumentRow} measuredMinimumWeightG={measured} weights={formWeights} submitLabel="Save plan" />
        </section>
      ) : null}
    </>
  );
}
