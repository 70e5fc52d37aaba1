// The drift study of one check type: its charts, signals and interval review, refreshed by React Query.
import { ChartLegend, type LegendItem } from "~/components/charts/chart-legend";
import { ControlChart } from "~/components/charts/control-chart";
import { formatDateTime, formatDay, formatTick, relativeDays } from "~/lib/format";
import type { SeriesParams } from "~/lib/series-params";
import { useSeriesQuery } from "~/hooks/use-series-query";
import type { InstrumentSeries } from "~/queries/series.server";
import { ChartFigure } from "./chart-figure";
import { PanDrawing } from "./pan-drawing";
import { chartUnit, domainOf, toChart } from "./series-chart-data";
import { ReviewBox, SignalsList } from "./signals-and-review";

const TITLES = { sensitivity: "Sensitivity error E", repeatability: "Repeatability s (effective)", eccentricity: "Eccentricity: largest |ΔI|" } as const;
const POINT_ITEMS: LegendItem[] = ["within", "guard", "out", "excluded", "signal"];
const LIMIT_ITEMS: LegendItem[] = ["center", "warning", "control", "acceptance", "tolerance", "baseline", "event"];

export function SeriesPanel({ instrumentId, params, initial, from, now }: { instrumentId: number; params: SeriesParams; initial: InstrumentSeries; from: Date | null; now: Date }) {
  const { data: series, isFetching } = useSeriesQuery(instrumentId, params, initial);
  if (!series) return <p className="text-sm text-ink-soft">Loading the {params.type} series…</p>;
  if (!series.points.length) {
    return <p className="rounded-md border border-dashed border-rule bg-card p-6 text-sm text-ink-soft">No {series.type} checks in this period. Choose a longer range, or record a check.</p>;
  }
  const unit = chartUnit(series);
  const chart = toChart(series, unit);
  const domain = domainOf(series, from, now);
  const zone = series.instrument.timeZone;
  const spanDays = (domain[1].getTime() - domain[0].getTime()) / 86_400_000;
  const tick = (at: Date) => formatTick(at, zone, spanDays);
  const k = chart.factor;
  const tol = series.requirement.tolerance === null ? null : series.requirement.tolerance * k;
  const acc = series.requirement.acceptance === null ? null : series.requirement.acceptance * k;
  const latest = series.points.at(-1)!;
  const common = { xDomain: domain, formatTick: tick, formatValue: chart.format, events: chart.events, stages: chart.stages };
  return (
    <div className="grid min-w-0 gap-4" aria-busy={isFetching}>
      <ForecastLine series={series} now={now} />
      <ChartFigure
        title={`${TITLES[series.type]} (${unit}), ${series.instrument.assetTag}`}
        description={`${series.points.length} checks from ${formatDay(series.points[0].at, zone)} to ${formatDay(latest.at, zone)}, times in ${zone}. Latest ${chart.format(latest.value * k)} ${unit}${tol !== null ? ` against a tolerance of ${series.requirement.twoSided ? "±" : ""}${chart.format(tol)} ${unit}` : ""}.`}
        legend={<ChartLegend items={[...POINT_ITEMS, ...LIMIT_ITEMS, ...(series.type === "sensitivity" ? (["ewma"] as LegendItem[]) : []), ...(series.trendBand.length ? (["trend"] as LegendItem[]) : [])]} />}
      >
        {(width, height) => (
          <ControlChart
            {...common}
            width={width}
            height={height}
            points={chart.points}
            acceptance={acc}
            tolerance={tol}
            twoSided={series.requirement.twoSided}
            ewma={series.type === "sensitivity" ? series.points.filter((p) => p.ewma !== null).map((p) => ({ at: new Date(p.at), value: p.ewma! * k })) : undefined}
            trend={series.trendBand.map((t) => ({ at: new Date(t.at), fit: t.fit * k, low: t.low * k, high: t.high * k }))}
            yLabel={unit}
          />
        )}
      </ChartFigure>
      {series.type === "sensitivity" ? <CusumFigure series={series} common={common} unit={unit} factor={k} /> : null}
      {series.type === "repeatability" ? <MinimumWeightFigure series={series} common={common} /> : null}
      {series.type === "eccentricity" && latest.details ? (
        <PanDrawing
          deviations={{ frontLeft: Number(latest.details.delta_frontLeft ?? 0), backLeft: Number(latest.details.delta_backLeft ?? 0), backRight: Number(latest.details.delta_backRight ?? 0), frontRight: Number(latest.details.delta_frontRight ?? 0) }}
          worst={String(latest.details.worstPosition ?? "")}
          format={(g) => `${g >= 0 ? "+" : ""}${chart.format(g * k)} ${unit}`}
          when={formatDateTime(latest.at, zone)}
        />
      ) : null}
      <StageTable series={series} unit={unit} factor={k} format={chart.format} />
      <div className="grid gap-4 lg:grid-cols-2">
        <SignalsList series={series} />
        <ReviewBox series={series} />
      </div>
      {series.warnings.length ? <p className="text-xs text-ink-faint">{series.warnings.join(" ")}</p> : null}
    </div>
  );
}

function ForecastLine({ series, now }: { series: InstrumentSeries; now: Date }) {
  const f = series.forecast;
  const zone = series.instrument.timeZone;
  const when = (at: string | number | null) => {
    if (typeof at !== "string") return "not forecast";
    if (Date.parse(at) <= now.getTime()) return `already beyond (fitted line since ${formatDay(at, zone)})`;
    return `${formatDay(at, zone)} (${relativeDays(at, now)})`;
  };
  if (!f || (!f.toleranceAt && !f.acceptanceAt && !f.earliestToleranceAt)) {
    return <p className="text-sm text-ink-soft">Forecast to tolerance: none — no significant trend towards a limit in the current stage.</p>;
  }
  return (
    <dl className="grid gap-x-6 gap-y-1 rounded-md border border-accent/40 bg-accent-wash p-3 text-sm sm:grid-cols-3" aria-label="Forecast">
      <div><dt className="text-ink-soft">Forecast to acceptance limit</dt><dd className="num font-medium">{when(f.acceptanceAt)}</dd></div>
      <div><dt className="text-ink-soft">Forecast to tolerance</dt><dd className="num font-medium">{when(f.toleranceAt)}</dd></div>
      <div><dt className="text-ink-soft">Earliest, 95 % prediction bound</dt><dd className="num font-medium">{when(f.earliestToleranceAt)}</dd></div>
    </dl>
  );
}

type Common = Pick<Parameters<typeof ControlChart>[0], "xDomain" | "formatTick" | "formatValue" | "events" | "stages">;

function CusumFigure({ series, common, unit, factor }: { series: InstrumentSeries; common: Common; unit: string; factor: number }) {
  const line = (key: "cusumHigh" | "cusumLow") => series.points.filter((p) => p[key] !== null).map((p) => ({ at: new Date(p.at), value: p[key]! * factor }));
  const stages = series.stages.map((s) => ({ from: new Date(s.from), to: new Date(s.to), center: null, warning: null, control: s.baseline ? ([5 * s.baseline.sigma * factor, 5 * s.baseline.sigma * factor] as [number, number]) : null, baselineEnd: null }));
  return (
    <ChartFigure title={`CUSUM of E (${unit})`} description="Upper sum C⁺ and lower sum C⁻ (k = 0.5σ̂); a sum above the decision interval h = 5σ̂ signals a shift of the mean." height={200} legend={<p className="mt-2 text-xs text-ink-soft">Solid ink: C⁺ (upward shift). Dashed teal: C⁻ (downward shift). Dashed ink: decision interval h = 5σ̂ of each stage. Dotted verticals: events that reset the baseline.</p>}>
      {(width, height) => (
        <ControlChart {...common} stages={stages} width={width} height={height} points={[]} extraLines={[{ key: "cusum-high", line: line("cusumHigh"), color: "var(--color-ink)" }, { key: "cusum-low", line: line("cusumLow"), color: "var(--color-accent)", dash: "4 2" }]} yLabel={unit} />
      )}
    </ChartFigure>
  );
}

function MinimumWeightFigure({ series, common }: { series: InstrumentSeries; common: Common }) {
  const smallest = series.instrument.smallestNetWeightG === null ? null : Number(series.instrument.smallestNetWeightG);
  const sf = series.requirement.safetyFactor;
  const unit = smallest !== null && smallest < 1 ? "mg" : "g";
  const k = unit === "mg" ? 1000 : 1;
  const points = series.points.map((p) => ({ at: new Date(p.at), value: 2000 * p.value * k }));
  const crossing = smallest === null ? undefined : series.points.find((p) => 2000 * p.value * sf > smallest);
  const limit = smallest === null ? [] : [{ at: common.xDomain[0], value: (smallest / sf) * k }, { at: common.xDomain[1], value: (smallest / sf) * k }];
  return (
    <ChartFigure
      title={`Minimum weight (${unit})`}
      description={`USP <41> minimum weight 2000·s against the smallest net weight divided by the safety factor ${sf}${crossing ? `; it first passed on ${formatDay(crossing.at, series.instrument.timeZone)}` : ""}.`}
      height={200}
      legend={<p className="mt-2 text-xs text-ink-soft">Solid ink: minimum weight of each check. Heavy vermilion: smallest net weight ÷ safety factor. Dashed mark: the day the minimum weight × safety factor first passed the smallest net weight.</p>}
    >
      {(width, height) => (
        <ControlChart
          {...common}
          stages={[]}
          events={[...(common.events ?? []), ...(crossing ? [{ at: new Date(crossing.at), label: "passes smallest net weight" }] : [])]}
          width={width}
          height={height}
          points={[]}
          extraLines={[{ key: "minimum-weight", line: points, color: "var(--color-ink)" }, { key: "limit", line: limit, color: "var(--color-out)", width: 2.5 }]}
          formatValue={(v) => v.toFixed(unit === "mg" ? 1 : 3)}
          yLabel={unit}
        />
      )}
    </ChartFigure>
  );
}

/** The limits of each stage in figures, so they can be read and compared without the chart. */
function StageTable({ series, unit, factor, format }: { series: InstrumentSeries; unit: string; factor: number; format: (v: number) => string }) {
  const zone = series.instrument.timeZone;
  // Centre and σ̂ are estimates, finer than any one reading: two more digits than d.
  const fine = (v: number) => v.toFixed(Math.max(0, (format(v).split(".")[1]?.length ?? 0) + 2));
  return (
    <details className="rounded-md border border-rule bg-card p-3 text-sm">
      <summary className="cursor-pointer font-medium">Limits per stage ({unit})</summary>
      <table className="mt-2 w-full" aria-label={`Limits per stage, ${series.type}`}>
        <thead className="text-ink-soft">
          <tr>{["Stage", "Baseline points", "Centre", "σ̂", "Control limits", "Warning limits"].map((h) => <th key={h} scope="col" className="px-2 py-1 text-left font-medium">{h}</th>)}</tr>
        </thead>
        <tbody>
          {series.stages.map((s) => (
            <tr key={s.index} className="border-t border-rule/60" data-stage={s.index}>
              <td className="px-2 py-1">{formatDay(s.from, zone)} – {formatDay(s.to, zone)}</td>
              <td className="num px-2 py-1">{s.baseline?.count ?? "fewer than 8"}</td>
              <td className="num px-2 py-1">{s.baseline ? fine(s.baseline.center * factor) : "—"}</td>
              <td className="num px-2 py-1">{s.baseline ? fine(s.baseline.sigma * factor) : "—"}</td>
              <td className="num px-2 py-1">{s.limits ? `${format(s.limits.lcl * factor)} … ${format(s.limits.ucl * factor)}` : "—"}</td>
              <td className="num px-2 py-1">{s.limits ? `${format(s.limits.lwl * factor)} … ${format(s.limits.uwl * factor)}` : "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}
