import { Form, Link } from "react-router";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { ExportParamsSchema } from "~/lib/export-params";
import { requireCapability } from "~/lib/guards.server";
import { exportCountQuery } from "~/queries/export.server";
import { listSitesAndRooms } from "~/queries/instruments.server";
import type { Route } from "./+types/export";

export const meta = () => [{ title: "Export checks · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "export_csv");
  const url = new URL(request.url);
  const parsed = ExportParamsSchema.safeParse(Object.fromEntries(url.searchParams));
  const { sites } = await listSitesAndRooms(db(), viewer);
  if (!parsed.success) return { sites, params: {}, count: null, errors: parsed.error.issues.map((i) => i.message), query: "" };
  const count = await db().$client.query<{ n: number }>(exportCountQuery(viewer, parsed.data).text, exportCountQuery(viewer, parsed.data).values);
  return { sites, params: parsed.data, count: count.rows[0].n, errors: [] as string[], query: url.searchParams.toString() };
}

const select = "rounded-md border border-rule bg-card px-2 py-1.5";

export default function Export({ loaderData }: Route.ComponentProps) {
  const { sites, params, count, errors, query } = loaderData;
  const p = params as Record<string, string | number | undefined>;
  return (
    <>
      <PageHeader title="Export checks" subtitle="Filter the check records and download them as CSV (RFC 4180, UTF-8). Every export is recorded in the audit trail." />
      <Form method="get" className="grid max-w-4xl gap-4 rounded-md border border-rule bg-card p-4 text-sm sm:grid-cols-4" aria-label="Export filters">
        <label className="flex flex-col gap-1"><span className="font-medium">Site</span><select name="site" defaultValue={p.site ?? ""} className={select}><option value="">All my sites</option>{sites.map((s) => <option key={s.id} value={s.id}>{s.code}</option>)}</select></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Instrument (asset tag)</span><input name="instrument" defaultValue={p.instrument ?? ""} className={select} /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Check type</span><select name="type" defaultValue={p.type ?? ""} className={select}><option value="">Any</option><option value="sensitivity">Sensitivity</option><option value="repeatability">Repeatability</option><option value="eccentricity">Eccentricity</option></select></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Outcome</span><select name="outcome" defaultValue={p.outcome ?? ""} className={select}><option value="">Any</option><option value="in_tolerance">Within acceptance</option><option value="guard_band">In guard band</option><option value="out_of_tolerance">Out of tolerance</option></select></label>
        <label className="flex flex-col gap-1"><span className="font-medium">From (UTC day)</span><input type="date" name="from" defaultValue={p.from ?? ""} className={select} /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">To (UTC day)</span><input type="date" name="to" defaultValue={p.to ?? ""} className={select} /></label>
        <label className="flex items-center gap-2 sm:pt-6"><input type="checkbox" name="signals" value="1" defaultChecked={p.signals === "1"} /> Only series with active signals</label>
        <label className="flex items-center gap-2 sm:pt-6"><input type="checkbox" name="bom" value="1" defaultChecked={p.bom === "1"} /> Byte-order mark for spreadsheets</label>
        <div className="sm:col-span-4 flex items-center gap-3">
          <button type="submit" className="rounded-md border border-rule px-3 py-1.5 font-medium hover:bg-paper-deep">Count matching checks</button>
          <Link to="/export" className="text-accent underline">Clear</Link>
        </div>
      </Form>
      {errors.length ? <p role="alert" className="mt-3 text-out">{errors.join(" ")}</p> : null}
      {count !== null ? (
        <div className="mt-4 flex flex-wrap items-center gap-4" role="status">
          <p><strong className="num">{count.toLocaleString("en")}</strong> checks match.</p>
          {count > 0 ? <a href={`/api/v1/export/checks.csv?${query}`} download className="rounded-md bg-accent px-4 py-2 font-medium text-paper hover:bg-accent-deep">Download CSV</a> : null}
        </div>
      ) : null}
      <div className="mt-6 max-w-3xl">
        <Caution>Exported results are copies: the records in Tareline, with their audit trail, remain the reference for your quality system. Cells that a spreadsheet would run as a formula are prefixed with an apostrophe.</Caution>
      </div>
    </>
  );
}
