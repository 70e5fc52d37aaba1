import { Form, Link } from "react-router";
import { ButtonLink } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { SortHeader } from "~/components/ui/sort-header";
import { StatusBadge } from "~/components/ui/status-badge";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { KIND_LABELS } from "~/lib/instrument-form";
import { can } from "~/lib/permissions";
import { InstrumentListParamsSchema, parseSearchParams } from "~/lib/search-params";
import { formatMass, naturalUnit } from "~/lib/units";
import { listInstruments, listSitesAndRooms } from "~/queries/instruments.server";
import { INSTRUMENT_KINDS, INSTRUMENT_STATUSES } from "../../db/schema/enums";
import type { Route } from "./+types/instruments";
import { Pager } from "~/components/ui/pager";

export const meta = () => [{ title: "Instruments · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const params = parseSearchParams(InstrumentListParamsSchema, request.url);
  const [page, places] = await Promise.all([listInstruments(db(), viewer, params), listSitesAndRooms(db(), viewer)]);
  return { page, params, ...places, canCreate: can(viewer, "manage_instruments") };
}

const STATUS_LABELS = { in_service: "In service", out_of_service: "Out of service", retired: "Retired" };

export default function Instruments({ loaderData }: Route.ComponentProps) {
  const { page, params, sites, rooms, canCreate } = loaderData;
  return (
    <>
      <PageHeader
        title="Instruments"
        subtitle={`${page.total} instrument${page.total === 1 ? "" : "s"} you may see`}
        action={canCreate ? <ButtonLink to="/instruments/new">Register an instrument</ButtonLink> : null}
      />
      <Form method="get" className="mb-4 flex flex-wrap items-end gap-3 text-sm" aria-label="Filter instruments">
        <label className="flex flex-col gap-1">
          <span className="text-xs font-medium text-ink-soft">Search</span>
          <input name="q" defaultValue={params.q ?? ""} placeholder="Asset tag, description, serial" className="w-56 rounded-md border border-rule bg-card px-2 py-1.5" />
        </label>
        <Select name="site" label="Site" value={params.site} options={sites.map((s) => [String(s.id), s.code])} />
        <Select name="room" label="Room" value={params.room} options={rooms.filter((r) => !params.site || r.siteId === params.site).map((r) => [String(r.id), r.name])} />
        <Select name="kind" label="Kind" value={params.kind} options={INSTRUMENT_KINDS.map((k) => [k, KIND_LABELS[k]])} />
        <Select name="status" label="Status" value={params.status} options={INSTRUMENT_STATUSES.map((s) => [s, STATUS_LABELS[s]])} />
        <input type="hidden" name="sort" value={params.sort} />
        <input type="hidden" name="dir" value={params.dir} />
        <button type="submit" className="rounded-md border border-rule bg-card px-3 py-1.5 font-medium hover:bg-paper-deep">Apply</button>
        <Link to="/instruments" className="py-1.5 text-accent underline">Clear</Link>
      </Form>
      {page.rows.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">
          No instrument matches these filters. Clear the filters{canCreate ? ", or register an instrument" : ""}.
        </p>
      ) : (
        <div className="overflow-x-auto rounded-md border border-rule bg-card">
          <table className="w-full text-sm">
            <thead className="border-b border-rule bg-paper-deep/50 text-ink-soft">
              <tr>
                <SortHeader column="assetTag" label="Asset tag" sort={params.sort} dir={params.dir} />
                <SortHeader column="kind" label="Kind" sort={params.sort} dir={params.dir} />
                <SortHeader column="capacity" label="Max" sort={params.sort} dir={params.dir} className="text-right" />
                <SortHeader column="readability" label="d" sort={params.sort} dir={params.dir} className="text-right" />
                <th scope="col" className="px-3 py-2 text-right font-medium">e</th>
                <th scope="col" className="px-3 py-2 text-left font-medium">Class</th>
                <SortHeader column="site" label="Site" sort={params.sort} dir={params.dir} />
                <SortHeader column="room" label="Room" sort={params.sort} dir={params.dir} />
                <SortHeader column="status" label="Status" sort={params.sort} dir={params.dir} />
                <th scope="col" className="px-3 py-2 text-right font-medium">Smallest net weight</th>
              </tr>
            </thead>
            <tbody>
              {page.rows.map((row) => (
                <tr key={row.id} className="border-b border-rule/60 last:border-0 hover:bg-paper">
                  <td className="px-3 py-2 font-medium">
                    <Link to={`/instruments/${row.id}`} className="text-accent-deep underline-offset-2 hover:underline">{row.assetTag}</Link>
                  </td>
                  <td className="px-3 py-2">{KIND_LABELS[row.kind]}</td>
                  <td className="num px-3 py-2 text-right">{formatMass(row.capacityG, naturalUnit(row.capacityG))}</td>
                  <td className="num px-3 py-2 text-right">{formatMass(row.readabilityG, naturalUnit(row.readabilityG))}</td>
                  <td className="num px-3 py-2 text-right">{formatMass(row.verificationIntervalG, naturalUnit(row.verificationIntervalG))}</td>
                  <td className="px-3 py-2">{row.accuracyClass ?? "—"}</td>
                  <td className="px-3 py-2">{row.siteCode}</td>
                  <td className="px-3 py-2">{row.roomName ?? "—"}</td>
                  <td className="px-3 py-2"><StatusBadge status={row.status} /></td>
                  <td className="num px-3 py-2 text-right">{row.smallestNetWeightG ? formatMass(row.smallestNetWeightG, naturalUnit(row.smallestNetWeightG)) : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Pager page={page.page} pages={page.pages} />
    </>
  );
}

function Select({ name, label, value, options }: { name: string; label: string; value: string | number | undefined; options: [string, string][] }) {
  return (
    <label className="flex flex-col gap-1">
      <span className="text-xs font-medium text-ink-soft">{label}</span>
      <select name={name} defaultValue={value === undefined ? "" : String(value)} className="rounded-md border border-rule bg-card px-2 py-1.5">
        <option value="">Any</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>{l}</option>
        ))}
      </select>
    </label>
  );
}
