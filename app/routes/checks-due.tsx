import { Link } from "react-router";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { listPlansDue } from "~/queries/fleet.server";
import type { Route } from "./+types/checks-due";

export const meta = () => [{ title: "Checks due · Tareline" }];

const TYPE_LABELS = { sensitivity: "Sensitivity", repeatability: "Repeatability", eccentricity: "Eccentricity" };

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "record_check");
  const plans = await listPlansDue(db(), viewer, new Date());
  return { due: plans.filter((p) => p.overdue).slice(0, 200), total: plans.length };
}

export default function ChecksDue({ loaderData }: Route.ComponentProps) {
  const { due, total } = loaderData;
  return (
    <>
      <PageHeader title="Checks due" subtitle={`${due.length} of ${total} planned checks at your sites are due now or overdue.`} />
      {due.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">Nothing is due. Every planned check at your sites is up to date.</p>
      ) : (
        <table className="w-full max-w-4xl rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 text-left font-medium">Instrument</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Check</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Site</th>
              <th scope="col" className="px-3 py-2 text-right font-medium">Every</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Last done</th>
            </tr>
          </thead>
          <tbody>
            {due.map((p) => (
              <tr key={p.planId} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2"><Link className="text-accent-deep underline" to={`/instruments/${p.instrumentId}`}>{p.assetTag}</Link></td>
                <td className="px-3 py-2"><Link className="text-accent-deep underline" to={`/instruments/${p.instrumentId}/record/${p.checkType}`}>Record {TYPE_LABELS[p.checkType].toLowerCase()}</Link></td>
                <td className="px-3 py-2">{p.siteCode}</td>
                <td className="num px-3 py-2 text-right">{p.intervalDays} d</td>
                <td className="px-3 py-2">{p.lastAt ? new Date(p.lastAt).toISOString().slice(0, 10) : "Never"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
