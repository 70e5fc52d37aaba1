import { Form, Link } from "react-router";
import { FleetHistoryPanels } from "~/components/fleet/fleet-history-panels";
import { FleetTable } from "~/components/fleet/fleet-table";
import { SiteComparison } from "~/components/fleet/site-comparison";
import { PageHeader } from "~/components/ui/page-header";
import { PanelBoundary } from "~/components/ui/panel-boundary";
import { db } from "~/lib/db.server";
import { FLEET_PAGE_SIZE, fleetPage, FleetParamsSchema } from "~/lib/fleet-params";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { parseSearchParams } from "~/lib/search-params";
import { compareSites, listFleet } from "~/queries/fleet-overview.server";
import { listSitesAndRooms } from "~/queries/instruments.server";
import type { Route } from "./+types/fleet";
import { Pager } from "~/components/ui/pager";

export const meta = () => [{ title: "Fleet · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  if (!can(viewer, "view_audit")) throw forbiddenPage("The fleet view is for site managers, metrologists, analysts and administrators.");
  const params = parseSearchParams(FleetParamsSchema, request.url);
  const now = new Date();
  const [rows, places] = await Promise.all([listFleet(db(), viewer, params, now), listSitesAndRooms(db(), viewer)]);
  // The comparison and the counts cover every instrument; the table, small multiples and heat map show one page of
  // the sorted list, so a fleet of thousands draws as fast as one of fifty (sorted by forecast, page 1 is the riskiest).
  const page = fleetPage(rows, params.page);
  return { page, overdue: rows.filter((r) => r.overdue).length, sites: compareSites(rows), params, siteOptions: places.sites, now: now.toISOString() };
}

export default function Fleet({ loaderData }: Route.ComponentProps) {
  const { page, overdue, sites, params, siteOptions } = loaderData;
  const now = new Date(loaderData.now);
  const first = (page.page - 1) * FLEET_PAGE_SIZE + 1;
  const pager = page.pages > 1 ? <Pager page={page.page} pages={page.pages} label="Pages of the fleet" className="" summary={`Instruments ${first}–${first + page.rows.length - 1} of ${page.total} · page ${page.page} of ${page.pages}`} /> : null;
  return (
    <>
      <PageHeader title="Fleet" subtitle={`${page.total} instruments · ${overdue} with an overdue check · drift and forecast from the ${params.type} checks`} />
      <Form method="get" className="mb-4 flex flex-wrap items-end gap-3 text-sm" aria-label="Filter the fleet">
        <label className="flex flex-col gap-1"><span className="text-xs font-medium text-ink-soft">Site</span>
          <select name="site" defaultValue={params.site ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5"><option value="">All my sites</option>{siteOptions.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1"><span className="text-xs font-medium text-ink-soft">Drift from</span>
          <select name="type" defaultValue={params.type} className="rounded-md border border-rule bg-card px-2 py-1.5"><option value="sensitivity">Sensitivity</option><option value="repeatability">Repeatability</option><option value="eccentricity">Eccentricity</option></select>
        </label>
        <label className="flex flex-col gap-1"><span className="text-xs font-medium text-ink-soft">Status</span>
          <select name="status" defaultValue={params.status ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5"><option value="">Any</option><option value="in_service">In service</option><option value="out_of_service">Out of service</option><option value="retired">Retired</option></select>
        </label>
        <label className="flex items-center gap-2 pb-1.5"><input type="checkbox" name="overdue" value="1" defaultChecked={params.overdue === "1"} /> Overdue only</label>
        <input type="hidden" name="sort" value={params.sort} />
        <input type="hidden" name="dir" value={params.dir} />
        <button type="submit" className="rounded-md border border-rule bg-card px-3 py-1.5 font-medium hover:bg-paper-deep">Apply</button>
        <Link to="/fleet" className="py-1.5 text-accent underline">Clear</Link>
      </Form>
      <div className="grid gap-6">
        <SiteComparison sites={sites} />
        {pager}
        {page.rows.length ? <FleetTable rows={page.rows} params={params} now={now} /> : <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">No instrument matches these filters.</p>}
        {pager}
        {page.rows.length ? (
          <PanelBoundary title="Recent history">
            <FleetHistoryPanels ids={page.rows.map((r) => r.id)} now={now} />
          </PanelBoundary>
        ) : null}
      </div>
    </>
  );
}
