import { Link } from "react-router";
import { CHECK_TYPE_LABELS, DueBadge } from "~/components/plans/due-badge";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import type { IntervalReview } from "~/lib/stats/interval-review";
import { listPlanRows } from "~/queries/plans.server";
import { listPlanSchedule } from "~/queries/schedule.server";
import type { Route } from "./+types/plans";

export const meta = () => [{ title: "Check plans · Tareline" }];

// The programme at a glance: every scheduled plan, its risk band and the engine's pending interval review.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view");
  const site = Number(new URL(request.url).searchParams.get("site")) || undefined;
  const schedule = await listPlanSchedule(db(), viewer, new Date(), { siteId: site });
  const extra = new Map((await listPlanRows(db(), schedule.map((s) => s.planId))).map((r) => [r.id, r]));
  return {
    plans: schedule.map((s) => ({ ...s, riskBand: extra.get(s.planId)?.riskBand ?? null, review: (extra.get(s.planId)?.review ?? null) as IntervalReview | null, weights: extra.get(s.planId)?.weights ?? 0 })),
  };
}

export default function Plans({ loaderData }: Route.ComponentProps) {
  const { plans } = loaderData;
  return (
    <>
      <PageHeader title="Check plans" subtitle={`${plans.length} plans on in-service instruments at your sites. Open an instrument's plans to add one.`} action={<Link to="/schedule" className="text-sm text-accent underline">Schedule</Link>} />
      <table className="w-full rounded-md border border-rule bg-card text-sm">
        <thead className="border-b border-rule text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 text-left font-medium">Instrument</th>
            <th scope="col" className="px-3 py-2 text-left font-medium">Check</th>
            <th scope="col" className="px-3 py-2 text-right font-medium">Every</th>
            <th scope="col" className="px-3 py-2 text-left font-medium">Risk</th>
            <th scope="col" className="px-3 py-2 text-left font-medium">Status</th>
            <th scope="col" className="px-3 py-2 text-left font-medium">Interval review</th>
          </tr>
        </thead>
        <tbody>
          {plans.map((p) => (
            <tr key={p.planId} className="border-b border-rule/60 last:border-0">
              <td className="px-3 py-2">{p.siteCode} · <Link to={`/instruments/${p.instrumentId}/plans`} className="text-accent-deep underline">{p.assetTag}</Link></td>
              <td className="px-3 py-2"><Link to={`/plans/${p.planId}`} className="text-accent-deep underline">{CHECK_TYPE_LABELS[p.checkType]}</Link>{p.weights === 0 && p.checkType !== "repeatability" ? <span className="ml-2 text-out">no weight</span> : null}</td>
              <td className="num px-3 py-2 text-right">{p.intervalDays} d</td>
              <td className="px-3 py-2">{p.riskBand ?? <span className="text-ink-faint">not assessed</span>}</td>
              <td className="px-3 py-2"><DueBadge state={p.due.state} daysOverdue={p.due.daysOverdue} /></td>
              <td className="px-3 py-2">{p.review && p.review.recommendation !== "keep" ? <strong>{p.review.recommendation}</strong> : <span className="text-ink-faint">{p.review ? "keep" : "—"}</span>}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
