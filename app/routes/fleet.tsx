import { PageHeader } from "~/components/ui/page-header";
import { StatusBadge } from "~/components/ui/status-badge";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { fleetStatusBySite } from "~/queries/fleet.server";
import { INSTRUMENT_STATUSES } from "../../db/schema/enums";
import type { Route } from "./+types/fleet";

export const meta = () => [{ title: "Fleet · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  if (!can(viewer, "view_audit")) throw forbiddenPage("The fleet view is for site managers, metrologists, analysts and administrators.");
  const rows = await fleetStatusBySite(db(), viewer);
  const bySite = new Map<number, { code: string; name: string; counts: Record<string, number> }>();
  for (const r of rows) {
    const site = bySite.get(r.siteId) ?? { code: r.siteCode, name: r.siteName, counts: {} };
    site.counts[r.status] = r.total;
    bySite.set(r.siteId, site);
  }
  return { sites: [...bySite.values()] };
}

export default function Fleet({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Fleet" subtitle="Instruments per site by status. Drift, forecasts and overdue checks join this view as check histories arrive." />
      <table className="w-full max-w-3xl rounded-md border border-rule bg-card text-sm">
        <caption className="sr-only">Instruments per site and status</caption>
        <thead className="border-b border-rule text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 text-left font-medium">Site</th>
            {INSTRUMENT_STATUSES.map((s) => <th key={s} scope="col" className="px-3 py-2 text-right font-medium"><StatusBadge status={s} /></th>)}
          </tr>
        </thead>
        <tbody>
          {loaderData.sites.map((s) => (
            <tr key={s.code} className="border-b border-rule/60 last:border-0">
              <th scope="row" className="px-3 py-2 text-left font-medium">{s.code} · {s.name}</th>
              {INSTRUMENT_STATUSES.map((st) => <td key={st} className="num px-3 py-2 text-right">{s.counts[st] ?? 0}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
