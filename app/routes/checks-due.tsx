import { Link } from "react-router";
import { CHECK_TYPE_LABELS, DueBadge } from "~/components/plans/due-badge";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { localDateTime } from "~/lib/schedule";
import { listPlansDue } from "~/queries/fleet.server";
import type { Route } from "./+types/checks-due";

export const meta = () => [{ title: "Checks due today · Tareline" }];

// The technician's list: what is due today or already overdue, in each site's own day.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "record_check");
  const plans = await listPlansDue(db(), viewer, new Date());
  const due = plans.filter((p) => p.overdue).map((p) => ({ ...p, lastValidLocal: p.lastValidAt ? localDateTime(p.lastValidAt, p.timeZone) : null }));
  const sites = [...new Map(due.map((p) => [p.siteId, { id: p.siteId, code: p.siteCode, today: p.due.today }])).values()];
  return { due: due.slice(0, 500), sites, total: plans.length };
}

export default function ChecksDue({ loaderData }: Route.ComponentProps) {
  const { due, sites, total } = loaderData;
  return (
    <>
      <PageHeader
        title="Checks due"
        subtitle={`${due.length} of ${total} planned checks at your sites are due today or overdue, by each site's local day.`}
        action={<Link to="/schedule" className="text-sm text-accent underline">Next 8 weeks</Link>}
      />
      {due.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">Nothing is due today. Every planned check at your sites is up to date; the schedule shows what comes next.</p>
      ) : (
        sites.map((site) => (
          <section key={site.id} aria-labelledby={`due-${site.id}`} className="mb-8">
            <h2 id={`due-${site.id}`} className="mb-2 font-semibold">{site.code} · today is {site.today} (site time)</h2>
            <table className="w-full max-w-5xl rounded-md border border-rule bg-card text-sm">
              <thead className="border-b border-rule text-ink-soft">
                <tr>
                  <th scope="col" className="px-3 py-2 text-left font-medium">Instrument</th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">Room</th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">Check</th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">Status</th>
                  <th scope="col" className="px-3 py-2 text-right font-medium">Every</th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">Last valid check (site time)</th>
                </tr>
              </thead>
              <tbody>
                {due.filter((p) => p.siteId === site.id).map((p) => (
                  <tr key={p.planId} className="border-b border-rule/60 last:border-0">
                    <td className="px-3 py-2"><Link className="text-accent-deep underline" to={`/instruments/${p.instrumentId}`}>{p.assetTag}</Link></td>
                    <td className="px-3 py-2">{p.roomName ?? "—"}</td>
                    <td className="px-3 py-2">
                      <Link className="text-accent-deep underline" to={`/instruments/${p.instrumentId}/record/${p.checkType}`}>Record {CHECK_TYPE_LABELS[p.checkType].toLowerCase()}</Link>
                      {p.expiredWeights.length ? <p className="text-xs text-out">Certificate expired: {p.expiredWeights.join(", ")} cannot be used.</p> : null}
                    </td>
                    <td className="px-3 py-2"><DueBadge state={p.due.state} daysOverdue={p.due.daysOverdue} /></td>
                    <td className="num px-3 py-2 text-right">{p.intervalDays} d</td>
                    <td className="num px-3 py-2">{p.lastValidLocal ?? "None yet"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        ))
      )}
    </>
  );
}
