import { Form, useLocation } from "react-router";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { SortHeader } from "~/components/ui/sort-header";
import { formatDateTime } from "~/lib/format";
import type { CheckTableParams } from "~/lib/check-table-params";
import { formatMass } from "~/lib/units";
import type { InstrumentCheckRow } from "~/queries/instrument-checks.server";
import type { MassUnit } from "../../../db/schema/enums";
import { Pager } from "~/components/ui/pager";

const TYPE_LABELS = { sensitivity: "Sensitivity", repeatability: "Repeatability", eccentricity: "Eccentricity" } as const;

interface Props {
  page: { rows: InstrumentCheckRow[]; total: number; page: number; pages: number };
  params: CheckTableParams;
  unit: MassUnit;
  readabilityG: string;
  timeZone: string;
  canReview: boolean;
}

/** Every check with its readings; a metrologist can exclude a point from the statistics or note something on it. */
export function ChecksTable({ page, params, unit, readabilityG, timeZone, canReview }: Props) {
  const location = useLocation();
  const mass = (g: number) => formatMass(g, unit, readabilityG);
  return (
    <section aria-labelledby="checks-heading" className="rounded-md border border-rule bg-card p-4">
      <h2 id="checks-heading" className="font-semibold">Checks</h2>
      <Form method="get" className="my-2 flex flex-wrap items-end gap-3 text-sm" preventScrollReset>
        {[...new URLSearchParams(location.search)].filter(([k]) => !["ctype", "coutcome", "cpage"].includes(k)).map(([k, v]) => <input key={k} type="hidden" name={k} value={v} />)}
        <label className="flex flex-col gap-1"><span className="text-xs text-ink-soft">Check type</span>
          <select name="ctype" defaultValue={params.ctype ?? ""} className="rounded-md border border-rule bg-card px-2 py-1"><option value="">Any</option>{Object.entries(TYPE_LABELS).map(([v, l]) => <option key={v} value={v}>{l}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1"><span className="text-xs text-ink-soft">Outcome</span>
          <select name="coutcome" defaultValue={params.coutcome ?? ""} className="rounded-md border border-rule bg-card px-2 py-1"><option value="">Any</option><option value="in_tolerance">Within acceptance</option><option value="guard_band">In guard band</option><option value="out_of_tolerance">Out of tolerance</option></select>
        </label>
        <button type="submit" className="rounded-md border border-rule px-3 py-1">Filter</button>
        <span className="text-ink-soft">{page.total} checks · times in {timeZone}</span>
      </Form>
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <thead className="text-ink-soft">
            <tr>
              <SortHeader column="performedAt" label="When" sort={params.csort} dir={params.cdir} param="csort" dirParam="cdir" pageParam="cpage" />
              <SortHeader column="type" label="Check" sort={params.csort} dir={params.cdir} param="csort" dirParam="cdir" pageParam="cpage" />
              <SortHeader column="result" label="Result" sort={params.csort} dir={params.cdir} param="csort" dirParam="cdir" pageParam="cpage" className="text-right" />
              <th scope="col" className="px-3 py-2 text-left font-medium">Readings as entered</th>
              <SortHeader column="outcome" label="Outcome" sort={params.csort} dir={params.cdir} param="csort" dirParam="cdir" pageParam="cpage" />
              <th scope="col" className="px-3 py-2 text-left font-medium">Operator · weight</th>
              {canReview ? <th scope="col" className="px-3 py-2 text-left font-medium">Statistics</th> : null}
            </tr>
          </thead>
          <tbody>
            {page.rows.map((c) => (
              <tr key={c.id} className={`border-t border-rule/60 align-top ${c.excluded ? "text-ink-faint" : ""}`}>
                <td className="num px-3 py-1.5 whitespace-nowrap">{formatDateTime(c.performedAt, timeZone)}</td>
                <td className="px-3 py-1.5">{TYPE_LABELS[c.type]}</td>
                <td className="num px-3 py-1.5 text-right whitespace-nowrap">{mass(c.resultG)}</td>
                <td className="num px-3 py-1.5 text-xs">{c.readings} {c.unit}</td>
                <td className="px-3 py-1.5"><OutcomeBadge outcome={c.outcome} />{c.excluded ? <span className="block text-xs">Excluded</span> : null}{c.notes ? <span className="block text-xs text-ink-soft">{c.notes}</span> : null}</td>
                <td className="px-3 py-1.5">{c.operator}{c.weight ? ` · ${c.weight}` : ""}</td>
                {canReview ? (
                  <td className="px-3 py-1.5">
                    <Form method="post" preventScrollReset className="flex gap-1">
                      <input type="hidden" name="checkId" value={c.id} />
                      <label className="sr-only" htmlFor={`reason-${c.id}`}>Reason for check {c.id}</label>
                      <input id={`reason-${c.id}`} name="reason" required minLength={5} placeholder="Reason" className="w-32 rounded border border-rule bg-card px-1.5 py-0.5 text-xs" />
                      <button type="submit" name="intent" value={c.excluded ? "include" : "exclude"} className="rounded border border-rule px-1.5 text-xs">{c.excluded ? "Include" : "Exclude"}</button>
                      <button type="submit" name="intent" value="annotate" className="rounded border border-rule px-1.5 text-xs">Note</button>
                    </Form>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Pager page={page.page} pages={page.pages} label="Check pages" param="cpage" previous="Newer" next="Older" keepScroll className="mt-2" />
    </section>
  );
}
