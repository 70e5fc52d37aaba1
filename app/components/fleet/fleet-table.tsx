import { Link } from "react-router";
import { SortHeader } from "~/components/ui/sort-header";
import { StatusBadge } from "~/components/ui/status-badge";
import { formatDay, relativeDays } from "~/lib/format";
import { describeSignal } from "~/lib/signal-advice";
import type { FleetParams } from "~/lib/fleet-params";
import { KIND_LABELS } from "~/lib/instrument-form";
import { formatMass, naturalUnit } from "~/lib/units";
import type { FleetRow } from "~/queries/fleet-overview.server";
import type { InstrumentKind } from "../../../db/schema/enums";

function Outcomes({ row }: { row: FleetRow }) {
  const total = row.inTolerance90 + row.guardBand90 + row.outOfTolerance90;
  if (!total) return <span className="text-ink-faint">none</span>;
  return (
    <span className="num whitespace-nowrap">
      {row.inTolerance90} within{row.guardBand90 ? ` · ${row.guardBand90} guard band` : ""}{row.outOfTolerance90 ? <strong className="text-out"> · {row.outOfTolerance90} out</strong> : ""}
    </span>
  );
}

function MinimumWeight({ row }: { row: FleetRow }) {
  if (row.minimumWeightG === null || !row.smallestNetWeightG) return <span className="text-ink-faint">—</span>;
  const smallest = Number(row.smallestNetWeightG);
  const fits = smallest >= (row.safetyFactor ?? 2) * row.minimumWeightG;
  const unit = naturalUnit(String(smallest));
  return (
    <span className="num whitespace-nowrap">
      {formatMass(row.minimumWeightG, unit, unit === "mg" ? "0.000001" : "0.001")} of {formatMass(row.smallestNetWeightG, unit)}
      {fits ? "" : <strong className="block text-xs text-out">below the safety factor</strong>}
    </span>
  );
}

export function FleetTable({ rows, params, now }: { rows: FleetRow[]; params: FleetParams; now: Date }) {
  const h = (column: string, label: string, className = "") => <SortHeader column={column} label={label} sort={params.sort} dir={params.dir} className={className} />;
  return (
    <div className="overflow-x-auto rounded-md border border-rule bg-card">
      <table className="w-full text-sm">
        <caption className="sr-only">Instruments you may see, with their drift and schedule</caption>
        <thead className="border-b border-rule bg-paper-deep/50 text-ink-soft">
          <tr>
            {h("assetTag", "Instrument")}
            <th scope="col" className="px-3 py-2 text-left font-medium">Site · room</th>
            {h("status", "Status")}
            {h("lastCheck", "Last check")}
            {h("nextDue", "Next due")}
            <th scope="col" className="px-3 py-2 text-left font-medium">Last 90 days</th>
            {h("drift", "Drift /30 d", "text-right")}
            {h("forecast", "Forecast to tolerance")}
            {h("signals", "Signals")}
            <th scope="col" className="px-3 py-2 text-left font-medium">Minimum weight</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-rule/60 align-top last:border-0 hover:bg-paper">
              <td className="px-3 py-2">
                <Link to={`/instruments/${r.id}`} className="font-medium whitespace-nowrap text-accent-deep underline-offset-2 hover:underline">{r.assetTag}</Link>
                <span className="block text-xs whitespace-nowrap text-ink-soft">{KIND_LABELS[r.kind as InstrumentKind]}</span>
              </td>
              <td className="px-3 py-2 whitespace-nowrap">{r.siteCode}{r.roomName ? ` · ${r.roomName}` : ""}</td>
              <td className="px-3 py-2"><StatusBadge status={r.status} /></td>
              <td className="num px-3 py-2 whitespace-nowrap">{r.lastCheckAt ? formatDay(r.lastCheckAt, r.timeZone) : "Never"}</td>
              <td className="num px-3 py-2 whitespace-nowrap">
                {r.nextDueAt ? (r.overdue ? <strong className="text-out">Overdue: was due {formatDay(r.nextDueAt, r.timeZone)}</strong> : formatDay(r.nextDueAt, r.timeZone)) : "—"}
              </td>
              <td className="px-3 py-2 text-xs"><Outcomes row={r} /></td>
              <td className="num px-3 py-2 text-right whitespace-nowrap">{r.driftPercentPer30Days === null ? "—" : `${r.driftPercentPer30Days >= 0 ? "+" : ""}${r.driftPercentPer30Days.toFixed(1)} %${r.driftSignificant ? "" : " (n.s.)"}`}</td>
              <td className="num px-3 py-2 whitespace-nowrap">{r.forecastToleranceAt ? `${formatDay(r.forecastToleranceAt, r.timeZone)} (${relativeDays(r.forecastToleranceAt, now)})` : "—"}</td>
              <td className="px-3 py-2 text-xs whitespace-nowrap" title={r.activeSignals.map((s) => describeSignal(s).name).join("\n")}>
                {r.activeSignals.length ? (
                  <span className="inline-flex items-center gap-1">
                    <svg width="9" height="9" viewBox="0 0 10 10" aria-hidden="true"><path d="M5 9 1 2h8Z" className="fill-signal" /></svg>
                    {r.activeSignals.length} active<span className="sr-only">: {r.activeSignals.map((s) => describeSignal(s).name).join("; ")}</span>
                  </span>
                ) : "—"}
              </td>
              <td className="px-3 py-2"><MinimumWeight row={r} /></td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
