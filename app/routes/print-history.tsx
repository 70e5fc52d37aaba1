import { Form, Link } from "react-router";
import { PrintCaution, PrintHeader, SignatureBlock } from "~/components/print/print-parts";
import printCss from "~/components/print/print.css?url";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { addDays, localDateTime } from "~/lib/schedule";
import { formatMass } from "~/lib/units";
import { getInstrumentHistory } from "~/queries/print.server";
import type { Route } from "./+types/print-history";

export const links: Route.LinksFunction = () => [{ rel: "stylesheet", href: printCss }];
export const meta = ({ data }: Route.MetaArgs) => [{ title: `History of ${data?.instrument.assetTag ?? ""} · Tareline` }];

const isDate = (v: string | null): v is string => v !== null && /^\d{4}-\d{2}-\d{2}$/.test(v);

// The period is whole UTC days, from the first day through the last; defaults to the last 365 days.
export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view");
  const url = new URL(request.url);
  const today = new Date().toISOString().slice(0, 10);
  const to = isDate(url.searchParams.get("to")) ? url.searchParams.get("to")! : today;
  const from = isDate(url.searchParams.get("from")) ? url.searchParams.get("from")! : addDays(to, -365);
  const history = await getInstrumentHistory(db(), viewer, Number(params.id), { from: new Date(`${from}T00:00:00Z`), to: new Date(`${addDays(to, 1)}T00:00:00Z`) });
  const tz = history.instrument.siteTimeZone;
  const at = (d: Date) => localDateTime(d, tz);
  const byOutcome = { in_tolerance: 0, guard_band: 0, out_of_tolerance: 0 };
  for (const c of history.checks) if (!c.c.supersededAt) byOutcome[c.c.outcome]++;
  return {
    from,
    to,
    tz,
    printedAt: `${at(new Date())} (${new Date().toISOString().slice(0, 16).replace("T", " ")} UTC)`,
    instrument: history.instrument,
    plans: history.plans.map((p) => ({ id: p.id, checkType: p.checkType, intervalDays: p.intervalDays, toleranceBasis: p.toleranceBasis, weights: p.weights, active: p.active })),
    checks: history.checks.map((c) => ({ id: c.c.id, at: at(c.c.performedAt), type: c.c.checkType, resultG: c.c.resultG, toleranceG: c.c.toleranceG, outcome: c.c.outcome, operator: c.operator, weight: c.weight, superseded: c.c.supersededAt !== null, corrects: c.c.correctsCheckId, reason: c.c.correctionReason })),
    events: history.events.map((e) => ({ id: e.e.id, at: at(e.e.occurredAt), kind: e.e.kind, note: e.e.note, by: e.by ?? "—" })),
    exclusions: history.exclusions.map((x) => ({ id: x.a.id, checkAt: at(x.performedAt), type: x.type, excluded: x.a.excluded, reason: x.a.reason, by: x.by, at: at(x.a.createdAt), withdrawn: x.a.withdrawnAt !== null })),
    decisions: history.decisions.map((d) => ({ id: d.d.id, at: at(d.d.decidedAt), recommendation: d.d.recommendation, decision: d.d.decision, from: d.d.previousIntervalDays, to: d.d.proposedIntervalDays, comment: d.d.comment, by: d.by })),
    signals: history.summaries.flatMap((s) => (s.activeSignals ?? []).map((sig) => `${s.checkType}: ${sig}`)),
    reviews: history.reviews.map((r) => ({ id: r.r.id, opened: at(r.r.openedAt), type: r.r.checkType, closed: r.r.closedAt ? at(r.r.closedAt) : null, by: r.closedBy, conclusion: r.r.conclusion })),
    releases: history.instrumentEvents.filter((e) => e.e.action === "instrument.release" || e.e.action === "instrument.out_of_service").map((e) => ({ id: e.e.id, at: at(e.e.at), action: e.e.action, by: e.by ?? "System" })),
    byOutcome,
  };
}

export default function PrintHistory({ loaderData: h }: Route.ComponentProps) {
  const i = h.instrument;
  const show = (g: number) => formatMass(g, i.displayUnit, i.readabilityG);
  const reviewers = [...new Set([...h.decisions.map((d) => d.by), ...h.exclusions.map((x) => x.by), ...h.releases.filter((r) => r.action === "instrument.release").map((r) => r.by), ...h.reviews.flatMap((r) => (r.by ? [r.by] : []))])];
  const performers = [...new Set(h.checks.map((c) => c.operator))];
  return (
    <main className="print-sheet">
      <PrintHeader title={`Instrument history · ${i.assetTag}`} subtitle={[i.description, `${i.siteCode} ${i.siteName}`, `${h.from} to ${h.to}`, `times in ${h.tz}`].filter(Boolean).join(" · ")} printedAt={h.printedAt} />
      <Form method="get" className="no-print mb-4 flex items-end gap-3 text-sm">
        <label className="flex flex-col">From<input type="date" name="from" defaultValue={h.from} className="rounded-md border border-rule px-2 py-1" /></label>
        <label className="flex flex-col">To<input type="date" name="to" defaultValue={h.to} className="rounded-md border border-rule px-2 py-1" /></label>
        <button type="submit" className="rounded-md border border-rule bg-card px-3 py-1">Show period</button>
      </Form>
      <h2>Summary</h2>
      <p>{h.checks.length} checks in the period ({h.byOutcome.in_tolerance} within acceptance, {h.byOutcome.guard_band} in guard band, {h.byOutcome.out_of_tolerance} out of tolerance, corrections counted once). Performed by {performers.join(", ") || "nobody"}; reviewed by {reviewers.join(", ") || "nobody in this period"}.</p>
      <h2>Plans</h2>
      <table><thead><tr><th>Check</th><th>Every</th><th>Requirement</th><th>Weights</th></tr></thead><tbody>{h.plans.map((p) => <tr key={p.id}><td>{p.checkType}{p.active ? "" : " (inactive)"}</td><td className="num">{p.intervalDays} d</td><td>{p.toleranceBasis}</td><td>{p.weights.join(", ") || "—"}</td></tr>)}</tbody></table>
      <h2>Checks</h2>
      {h.checks.length === 0 ? <p>No checks in this period.</p> : (
        <table><thead><tr><th>When</th><th>Check</th><th>Result</th><th>T</th><th>Outcome</th><th>Performed by</th><th>Weight</th></tr></thead>
          <tbody>{h.checks.map((c) => (
            <tr key={c.id}>
              <td className="num">{c.at}</td>
              <td>{c.type}{c.superseded ? " · corrected" : ""}{c.corrects ? ` · corrects ${c.corrects}: ${c.reason}` : ""}</td>
              <td className="num">{show(c.resultG)}</td>
              <td className="num">{c.toleranceG === null ? "—" : show(c.toleranceG)}</td>
              <td><OutcomeBadge outcome={c.outcome} /></td>
              <td>{c.operator}</td>
              <td>{c.weight ?? "—"}</td>
            </tr>))}
          </tbody>
        </table>
      )}
      <h2>Events</h2>
      {h.events.length === 0 ? <p>No events in this period.</p> : <table><thead><tr><th>When</th><th>Event</th><th>Note</th><th>By</th></tr></thead><tbody>{h.events.map((e) => <tr key={e.id}><td className="num">{e.at}</td><td>{e.kind}</td><td>{e.note}</td><td>{e.by}</td></tr>)}</tbody></table>}
      <h2>Statistical signals now active</h2>
      <p>{h.signals.length ? h.signals.join("; ") : "None."}</p>
      <h2>Exclusions with reasons</h2>
      {h.exclusions.length === 0 ? <p>No points excluded in this period.</p> : <table><thead><tr><th>Check of</th><th>Type</th><th>Reason</th><th>By, when</th></tr></thead><tbody>{h.exclusions.map((x) => <tr key={x.id}><td className="num">{x.checkAt}</td><td>{x.type}{x.withdrawn ? " (withdrawn)" : ""}</td><td>{x.reason}</td><td>{x.by}, {x.at}</td></tr>)}</tbody></table>}
      <h2>Reviews and releases</h2>
      {h.decisions.length + h.reviews.length + h.releases.length === 0 ? <p>None in this period.</p> : (
        <table><thead><tr><th>When</th><th>What</th><th>By</th></tr></thead><tbody>
          {h.decisions.map((d) => <tr key={`d${d.id}`}><td className="num">{d.at}</td><td>Interval review {d.recommendation} {d.decision} ({d.from} → {d.decision === "approved" ? d.to : d.from} d): {d.comment}</td><td>{d.by}</td></tr>)}
          {h.reviews.map((r) => <tr key={`r${r.id}`}><td className="num">{r.opened}</td><td>Impact review ({r.type}){r.closed ? ` closed ${r.closed}: ${r.conclusion}` : " open"}</td><td>{r.by ?? "—"}</td></tr>)}
          {h.releases.map((r) => <tr key={`a${r.id}`}><td className="num">{r.at}</td><td>{r.action === "instrument.release" ? "Released to service" : "Taken out of service"}</td><td>{r.by}</td></tr>)}
        </tbody></table>
      )}
      <SignatureBlock left="Prepared by" right="Reviewed and approved by" />
      <PrintCaution />
      <p className="no-print mt-6 text-sm"><Link to={`/instruments/${i.id}`} className="text-accent underline">Back to {i.assetTag}</Link></p>
    </main>
  );
}
