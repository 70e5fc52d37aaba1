import { Link } from "react-router";
import { CHECK_TYPE_LABELS, DueBadge } from "~/components/plans/due-badge";
import { TOLERANCE_BASIS_LABELS } from "~/components/plans/plan-form-schema";
import { ButtonLink } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { can } from "~/lib/permissions";
import type { RiskAssessment } from "~/lib/risk";
import { instrumentRow, plansOfInstrument } from "~/queries/plans.server";
import { listPlanSchedule } from "~/queries/schedule.server";
import { CHECK_TYPES } from "../../db/schema/enums";
import type { Route } from "./+types/plans-instrument";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `Check plans · ${data?.instrument.assetTag ?? ""} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const { visible } = await instrumentRow(db(), viewer, Number(params.id));
  const [plans, schedule] = await Promise.all([plansOfInstrument(db(), visible.id), listPlanSchedule(db(), viewer, new Date(), { instrumentId: visible.id })]);
  const assessed = plans.map((p) => p.riskAssessment as RiskAssessment | null).filter((r): r is RiskAssessment => r !== null).at(-1) ?? null;
  const missing = assessed ? CHECK_TYPES.filter((t) => assessed.suggestedIntervals[t] && !plans.some((p) => p.checkType === t)) : [];
  return {
    instrument: visible,
    plans: plans.map((p) => ({ id: p.id, checkType: p.checkType, intervalDays: p.intervalDays, toleranceBasis: p.toleranceBasis, active: p.active, due: schedule.find((s) => s.planId === p.id)?.due ?? null })),
    missing: missing.map((t) => ({ type: t, days: assessed!.suggestedIntervals[t]! })),
    canEdit: can(viewer, "manage_instruments", visible.siteId),
  };
}

export default function InstrumentPlans({ loaderData }: Route.ComponentProps) {
  const { instrument, plans, missing, canEdit } = loaderData;
  const free = CHECK_TYPES.filter((t) => !plans.some((p) => p.checkType === t));
  return (
    <>
      <PageHeader
        title={`Check plans · ${instrument.assetTag}`}
        subtitle="Which checks this instrument gets, how often and against which requirement."
        action={canEdit && free.length ? <ButtonLink to={`/instruments/${instrument.id}/plans/new`}>New plan from a risk assessment</ButtonLink> : null}
      />
      <p className="mb-4 text-sm"><Link to={`/instruments/${instrument.id}`} className="text-accent underline">Back to {instrument.assetTag}</Link></p>
      {missing.length ? (
        <p role="status" className="mb-4 max-w-3xl rounded-md border border-guard/60 bg-card p-3 text-sm">
          The latest risk assessment also suggests {missing.map((m) => `${m.type} every ${m.days} days`).join(" and ")}, which has no plan yet.{" "}
          {canEdit ? missing.map((m) => <Link key={m.type} to={`/instruments/${instrument.id}/plans/new?type=${m.type}`} className="mr-2 text-accent underline">Plan {m.type}</Link>) : null}
        </p>
      ) : null}
      {plans.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">No check plan yet.{canEdit ? " Create one from a risk assessment." : " A metrologist sets them."}</p>
      ) : (
        <table className="w-full max-w-4xl rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 text-left font-medium">Check</th>
              <th scope="col" className="px-3 py-2 text-right font-medium">Every</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Requirement</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Status</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Next due (site day)</th>
            </tr>
          </thead>
          <tbody>
            {plans.map((p) => (
              <tr key={p.id} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2"><Link to={`/plans/${p.id}`} className="text-accent-deep underline">{CHECK_TYPE_LABELS[p.checkType]}</Link></td>
                <td className="num px-3 py-2 text-right">{p.intervalDays} d</td>
                <td className="px-3 py-2">{TOLERANCE_BASIS_LABELS[p.toleranceBasis]}</td>
                <td className="px-3 py-2">{p.due ? <DueBadge state={p.due.state} daysOverdue={p.due.daysOverdue} /> : <span className="text-ink-soft">Not scheduled (instrument {instrument.status.replaceAll("_", " ")})</span>}</td>
                <td className="num px-3 py-2">{p.due?.dueOn ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
