import { Link } from "react-router";
import { PrintCaution, PrintHeader, SignatureBlock } from "~/components/print/print-parts";
import printCss from "~/components/print/print.css?url";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { localDateTime } from "~/lib/schedule";
import { formatMass, formatUncertainty, naturalUnit } from "~/lib/units";
import { getCheckRecord } from "~/queries/print.server";
import type { Route } from "./+types/print-check";

export const links: Route.LinksFunction = () => [{ rel: "stylesheet", href: printCss }];
export const meta = ({ data }: Route.MetaArgs) => [{ title: `Check record ${data?.check.id ?? ""} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view");
  const record = await getCheckRecord(db(), viewer, Number(params.id));
  const tz = record.instrument.siteTimeZone;
  const both = (d: Date) => `${localDateTime(d, tz)} (${d.toISOString().slice(0, 16).replace("T", " ")} UTC)`;
  return {
    ...record,
    performed: both(record.check.performedAt),
    recorded: both(record.check.recordedAt),
    superseded: record.check.supersededAt ? both(record.check.supersededAt) : null,
    printedAt: both(new Date()),
    events: record.events.map((e) => ({ id: e.e.id, action: e.e.action, by: e.by ?? "System", at: both(e.e.at) })),
    annotations: record.annotations.map((a) => ({ id: a.a.id, excluded: a.a.excluded, reason: a.a.reason, by: a.by, at: both(a.a.createdAt), withdrawn: a.a.withdrawnAt ? both(a.a.withdrawnAt) : null })),
  };
}

export default function PrintCheck({ loaderData: r }: Route.ComponentProps) {
  const c = r.check;
  const i = r.instrument;
  const show = (g: number) => formatMass(g, c.unit, i.readabilityG);
  return (
    <main className="print-sheet">
      <PrintHeader title={`Check record ${c.id}`} subtitle={[i.assetTag, i.description, `${i.siteCode} ${i.siteName}`].filter(Boolean).join(" · ")} printedAt={r.printedAt} />
      {r.supersededBy ? <p role="alert" className="mb-3 border-2 border-out p-2 font-medium">Corrected: superseded on {r.superseded} by check {r.supersededBy.id}. Reason: {r.supersededBy.reason}. This original is kept unchanged.</p> : null}
      {c.correctsCheckId ? <p className="mb-3 border border-ink p-2">This check corrects check {c.correctsCheckId}. Reason for change: {c.correctionReason}</p> : null}
      <h2>Result</h2>
      <dl>
        <dt>Check</dt><dd>{c.checkType}</dd>
        <dt>Outcome</dt><dd><OutcomeBadge outcome={c.outcome} /></dd>
        <dt>Result</dt><dd className="num">{show(c.resultG)}</dd>
        <dt>Tolerance T · acceptance A</dt><dd className="num">{c.toleranceG === null ? "—" : `± ${show(c.toleranceG)} · ± ${show(c.acceptanceG ?? c.toleranceG)}`} ({c.basis})</dd>
        <dt>Expanded uncertainty (k = 2)</dt><dd className="num">{c.expandedUncertaintyG === null ? "—" : formatUncertainty(c.expandedUncertaintyG, c.expandedUncertaintyG < 1 ? "mg" : c.unit)}</dd>
        <dt>Performed</dt><dd>{r.performed} by {r.operator}</dd>
        <dt>Recorded</dt><dd>{r.recorded} · {c.source}</dd>
        {c.note ? <><dt>Note</dt><dd>{c.note}</dd></> : null}
      </dl>
      <h2>Readings as entered ({c.unit})</h2>
      <table><thead><tr><th>#</th><th>Position</th><th>Reading</th></tr></thead><tbody>{r.readings.map((x) => <tr key={x.ordinal}><td>{x.ordinal}</td><td>{x.position ?? "—"}</td><td className="num">{x.value}</td></tr>)}</tbody></table>
      <h2>Instrument, plan and weight</h2>
      <dl>
        <dt>Max · d · e · class</dt><dd className="num">{formatMass(i.capacityG, naturalUnit(i.capacityG))} · {formatMass(i.readabilityG, naturalUnit(i.readabilityG))} · {formatMass(i.verificationIntervalG, naturalUnit(i.verificationIntervalG))} · {i.accuracyClass ?? "no class"}</dd>
        <dt>Plan</dt><dd>{r.plan ? `${r.plan.checkType} every ${r.plan.intervalDays === 1 ? "day" : `${r.plan.intervalDays} days`}, ${r.plan.toleranceBasis}` : "—"}</dd>
        <dt>Test weight</dt><dd className="num">{r.weight ? `${r.weight.identifier} · ${r.weight.weightClass} · conventional mass ${r.weight.conventionalMassG} g · U ${formatMass(r.weight.expandedUncertaintyG, "mg")} · certificate ${r.weight.certificateNumber}, due ${r.weight.dueOn}` : "None (a repeatability load need not be calibrated)"}</dd>
      </dl>
      {r.annotations.length ? (<><h2>Exclusions</h2><table><thead><tr><th>When</th><th>By</th><th>Excluded</th><th>Reason</th></tr></thead><tbody>{r.annotations.map((a) => <tr key={a.id}><td>{a.at}{a.withdrawn ? ` (withdrawn ${a.withdrawn})` : ""}</td><td>{a.by}</td><td>{a.excluded ? "Yes" : "No"}</td><td>{a.reason}</td></tr>)}</tbody></table></>) : null}
      <h2>Audit trail of this check</h2>
      <table><thead><tr><th>When</th><th>Who</th><th>What</th></tr></thead><tbody>{r.events.map((e) => <tr key={e.id}><td>{e.at}</td><td>{e.by}</td><td>{e.action}</td></tr>)}</tbody></table>
      <SignatureBlock left={`Performed by (${r.operator})`} right="Reviewed by" />
      <PrintCaution />
      <p className="no-print mt-6 text-sm"><Link to={`/instruments/${i.id}`} className="text-accent underline">Back to {i.assetTag}</Link> · <Link to={`/checks/${c.id}/correct`} className="text-accent underline">Correct this check</Link></p>
    </main>
  );
}
