// Turns an instrument's series (grams, ISO times) into chart data in the unit a person reads it in.
import type { ChartEvent, ChartPoint, ChartStage, PointShape } from "~/components/charts/chart-types";
import { OUTCOME_LABELS } from "~/components/ui/outcome-badge";
import { formatDateTime } from "~/lib/format";
import { describeSignal } from "~/lib/signal-advice";
import type { MassUnit } from "../../../db/schema/enums";
import type { InstrumentSeries } from "~/queries/series.server";

const FACTOR: Record<MassUnit, number> = { mg: 1000, g: 1, kg: 0.001 };
const SHAPE = { in_tolerance: "within", guard_band: "guard", out_of_tolerance: "out" } as const;

/** mg for sub-gram limits, kg from a kilogram, else g. */
export function chartUnit(series: InstrumentSeries): MassUnit {
  const scale = Math.abs(series.requirement.tolerance ?? series.points.at(-1)?.value ?? 1);
  return scale < 0.1 ? "mg" : scale >= 1000 ? "kg" : "g";
}

export function toChart(series: InstrumentSeries, unit: MassUnit, pick: (p: InstrumentSeries["points"][number]) => number | null = (p) => p.value) {
  const k = FACTOR[unit];
  const zone = series.instrument.timeZone;
  const decimals = Math.max(0, Math.min(6, -Math.floor(Math.log10(Number(series.instrument.readabilityG) * k)) + 1));
  const fmt = (v: number) => v.toFixed(decimals);
  const points: ChartPoint[] = series.points.flatMap((p) => {
    const v = pick(p);
    if (v === null) return [];
    const shape: PointShape = p.excluded ? "excluded" : SHAPE[p.outcome];
    return [{
      id: p.checkId,
      at: new Date(p.at),
      value: v * k,
      shape,
      signal: p.signals.length > 0,
      tooltip: [
        `${formatDateTime(p.at, zone)} (${zone})`,
        `${fmt(v * k)} ${unit} · ${p.excluded ? "Excluded from statistics" : OUTCOME_LABELS[p.outcome]}`,
        `By ${p.operator}`,
        ...p.signals.map((s) => describeSignal(s).name),
        ...p.annotations.map((a) => `Note: ${a}`),
      ],
    }];
  });
  const stages: ChartStage[] = series.stages.map((s) => ({
    from: new Date(s.from),
    to: new Date(s.to),
    center: s.baseline ? s.baseline.center * k : null,
    warning: s.limits ? [s.limits.uwl * k, s.limits.lwl * k] : null,
    control: s.limits ? [s.limits.ucl * k, s.limits.lcl * k] : null,
    baselineEnd: s.baselineEndsAt ? new Date(s.baselineEndsAt) : null,
  }));
  const events: ChartEvent[] = series.events.map((e) => ({ at: new Date(e.at), label: e.kind }));
  return { points, stages, events, factor: k, format: fmt };
}

export function domainOf(series: InstrumentSeries, from: Date | null, now: Date): [Date, Date] {
  const first = series.points[0] ? new Date(series.points[0].at) : new Date(now.getTime() - 90 * 86_400_000);
  const lastTrend = series.trendBand.at(-1);
  const end = lastTrend ? new Date(Math.max(now.getTime(), Date.parse(lastTrend.at))) : now;
  return [from && from > first ? from : first, end];
}
