// A control chart: points shaped by outcome, statistical limits per stage, requirement limits, events,
// EWMA and trend band. Stateless; the parent gives it its size and data.
import { Axis, GlyphSeries, Grid, Tooltip, XYChart } from "@visx/xychart";
import { useMemo, type ReactNode } from "react";
import { EventLayer, PolylineLayer, RequirementLayer, StageLayer, TrendLayer } from "./chart-layers";
import type { ChartEvent, ChartLine, ChartPoint, ChartStage, TrendSample } from "./chart-types";
import { PointGlyph, SignalGlyph } from "./glyphs";

export interface ControlChartProps {
  width: number;
  height: number;
  points: ChartPoint[];
  stages?: ChartStage[];
  acceptance?: number | null;
  tolerance?: number | null;
  twoSided?: boolean;
  ewma?: ChartLine[];
  extraLines?: { line: ChartLine[]; className: string; dash?: string }[];
  trend?: TrendSample[];
  events?: ChartEvent[];
  xDomain: [Date, Date];
  formatTick: (at: Date) => string;
  formatValue: (v: number) => string;
  yLabel: string;
  children?: ReactNode;
}

const x = (p: ChartPoint) => p.at;
const y = (p: ChartPoint) => p.value;

function yDomain(props: ControlChartProps): [number, number] {
  const values = props.points.map((p) => p.value);
  for (const s of props.stages ?? []) values.push(...(s.control ?? []));
  if (props.tolerance != null) values.push(props.tolerance, props.twoSided ? -props.tolerance : 0);
  for (const t of props.trend ?? []) values.push(t.fit);
  for (const l of props.extraLines ?? []) values.push(...l.line.map((p) => p.value));
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const pad = (hi - lo || Math.abs(hi) || 1) * 0.08;
  return [lo - pad, hi + pad * 2];
}

export function ControlChart(props: ControlChartProps) {
  const domain = useMemo(() => yDomain(props), [props]);
  const signalled = useMemo(() => props.points.filter((p) => p.signal), [props.points]);
  if (props.width < 50) return null;
  return (
    <XYChart width={props.width} height={props.height} margin={{ top: 16, right: 16, bottom: 32, left: 64 }} xScale={{ type: "time", domain: props.xDomain }} yScale={{ type: "linear", domain, nice: true }}>
      <Grid columns={false} numTicks={5} lineStyle={{ stroke: "var(--color-rule)", strokeWidth: 0.5 }} />
      <StageLayer stages={props.stages ?? []} />
      <RequirementLayer from={props.xDomain[0]} to={props.xDomain[1]} acceptance={props.acceptance ?? null} tolerance={props.tolerance ?? null} twoSided={props.twoSided ?? true} />
      <EventLayer events={props.events ?? []} />
      <TrendLayer samples={props.trend ?? []} />
      {props.extraLines?.map((l, i) => <PolylineLayer key={i} line={l.line} className={l.className} dash={l.dash} />)}
      {props.ewma?.length ? <PolylineLayer line={props.ewma} className="stroke-signal" /> : null}
      {props.children}
      <GlyphSeries dataKey="points" data={props.points} xAccessor={x} yAccessor={y} renderGlyph={({ x: gx, y: gy, datum }) => <PointGlyph x={gx} y={gy} shape={datum.shape} />} />
      <GlyphSeries dataKey="signals" data={signalled} xAccessor={x} yAccessor={y} renderGlyph={({ x: gx, y: gy }) => <SignalGlyph x={gx} y={gy} />} />
      <Axis orientation="bottom" numTicks={6} tickFormat={(v: Date) => props.formatTick(v)} stroke="var(--color-ink-soft)" tickStroke="var(--color-ink-soft)" tickLabelProps={{ fill: "var(--color-ink-soft)", fontSize: 11 }} />
      <Axis orientation="left" numTicks={5} label={props.yLabel} labelOffset={40} tickFormat={(v: number) => props.formatValue(v)} stroke="var(--color-ink-soft)" tickStroke="var(--color-ink-soft)" tickLabelProps={{ fill: "var(--color-ink-soft)", fontSize: 11 }} labelProps={{ fill: "var(--color-ink)", fontSize: 12 }} />
      <Tooltip<ChartPoint>
        snapTooltipToDatumX
        snapTooltipToDatumY
        showVerticalCrosshair
        renderTooltip={({ tooltipData }) => {
          const datum = tooltipData?.nearestDatum?.datum;
          if (!datum) return null;
          return (
            <div className="max-w-72 text-xs">
              {datum.tooltip.map((line, i) => <p key={i} className={i === 0 ? "font-semibold" : ""}>{line}</p>)}
            </div>
          );
        }}
      />
    </XYChart>
  );
}
