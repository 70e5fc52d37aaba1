import { Form, Link, useSearchParams } from "react-router";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { localDateTime } from "~/lib/schedule";
import { parseSearchParams } from "~/lib/search-params";
import { auditFilterChoices, AuditFilterSchema, changedFields, listAuditEvents } from "~/queries/audit-trail.server";
import type { Route } from "./+types/audit";
import { Pager } from "~/components/ui/pager";

export const meta = () => [{ title: "Audit trail · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view_audit");
  const filter = parseSearchParams(AuditFilterSchema, request.url);
  const [page, choices] = await Promise.all([listAuditEvents(db(), viewer, filter), auditFilterChoices(db(), viewer)]);
  return {
    filter,
    ...choices,
    total: page.total,
    pages: page.pages,
    rows: page.rows.map((r) => ({
      id: r.id,
      chainSeq: r.chainSeq,
      utc: r.at.toISOString().slice(0, 19).replace("T", " "),
      local: r.timeZone ? `${localDateTime(r.at, r.timeZone)} ${r.siteCode}` : null,
      actor: r.actorName ?? "System",
      action: r.action,
      entity: `${r.entityType}${r.entityId ? ` ${r.entityId}` : ""}`,
      entityType: r.entityType,
      entityId: r.entityId,
      changes: changedFields(r.before, r.after),
    })),
  };
}

const OPEN: Record<string, (id: string) => string> = {
  check: (id) => `/print/checks/${id}`,
  plan: (id) => `/plans/${id}`,
  weight: (id) => `/weights/${id}`,
  instrument: (id) => `/instruments/${id}`,
};

export default function Audit({ loaderData }: Route.ComponentProps) {
  const { filter, entities, actors, rows, total, pages } = loaderData;
  const [search] = useSearchParams();
  return (
    <>
      <PageHeader title="Audit trail" subtitle={`${total} ${total === 1 ? "event" : "events"}. Append-only and hash-chained: every change with who, when, what, before and after.`} action={<a href={`/api/v1/audit.csv?${new URLSearchParams([...search.entries()].filter(([k]) => k !== "page"))}`} className="text-sm text-accent underline">Download CSV</a>} />
      <Form method="get" className="mb-4 flex flex-wrap items-end gap-3 text-sm" aria-label="Filter the audit trail">
        <label className="flex flex-col gap-1"><span className="font-medium">Entity</span>
          <select name="entity" defaultValue={filter.entity ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5"><option value="">Any</option>{entities.map((e) => <option key={e} value={e}>{e}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1"><span className="font-medium">Entity id</span><input name="entityId" defaultValue={filter.entityId ?? ""} className="w-24 rounded-md border border-rule bg-card px-2 py-1.5" /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">Person</span>
          <select name="actor" defaultValue={filter.actor ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5"><option value="">Anyone</option>{actors.map((a) => <option key={a.id} value={a.id}>{a.name}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1"><span className="font-medium">From (UTC day)</span><input type="date" name="from" defaultValue={filter.from ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5" /></label>
        <label className="flex flex-col gap-1"><span className="font-medium">To (UTC day)</span><input type="date" name="to" defaultValue={filter.to ?? ""} className="rounded-md border border-rule bg-card px-2 py-1.5" /></label>
        <button type="submit" className="rounded-md border border-rule bg-card px-3 py-1.5">Filter</button>
        <Link to="/audit" className="py-1.5 text-accent underline">Clear</Link>
      </Form>
      {rows.length === 0 ? <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">No events match these filters.</p> : (
        <table className="w-full rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>{["When (UTC)", "When (site)", "Who", "What", "Entity", "Before → after"].map((h) => <th key={h} scope="col" className="px-3 py-2 text-left font-medium">{h}</th>)}</tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-rule/60 align-top last:border-0">
                <td className="num whitespace-nowrap px-3 py-2">{r.utc}</td>
                <td className="num whitespace-nowrap px-3 py-2">{r.local ?? "—"}</td>
                <td className="px-3 py-2">{r.actor}</td>
                <td className="px-3 py-2 font-medium">{r.action}</td>
                <td className="px-3 py-2">
                  <Link to={`?entity=${r.entityType}${r.entityId ? `&entityId=${encodeURIComponent(r.entityId)}` : ""}`} className="text-accent-deep underline" title="Only this entity's events">{r.entity}</Link>
                  {r.entityId && OPEN[r.entityType] ? <Link to={OPEN[r.entityType](r.entityId)} className="ml-2 text-xs text-accent underline">open</Link> : null}
                </td>
                <td className="px-3 py-2">
                  {r.changes.length === 0 ? <span className="text-ink-faint">—</span> : (
                    <details><summary className="cursor-pointer">{r.changes.length} field{r.changes.length === 1 ? "" : "s"}: {r.changes.slice(0, 3).map((c) => c.field).join(", ")}{r.changes.length > 3 ? "…" : ""}</summary>
                      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-xs">{r.changes.map((c) => <div key={c.field} className="contents"><dt className="font-medium">{c.field}</dt><dd className="num break-all"><span className="text-ink-soft line-through decoration-ink-faint">{c.before}</span> → {c.after}</dd></div>)}</dl>
                    </details>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {pages > 1 ? <Pager page={filter.page} pages={pages} previous="Newer" next="Older" /> : null}
    </>
  );
}
