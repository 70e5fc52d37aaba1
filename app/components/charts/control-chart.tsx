// A control chart: points shaped by outcome, statistical limits per stage, requirement limits, events,
// EWMA and trend band. Stateless; the parent gives it its size and data.
import { Axis, GlyphSeries, Grid, LineSeries, Tooltip, XYChart } from "@visx/xychart";
import { useMemo, type ReactNode } from "react";
import { EventLayer, RequirementLayer, StageLayer, TrendLayer } from "./chart-layers";
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
  /** Lines drawn as data series (EWMA, CUSUM sums, minimum weight); colours are theme variables. */
  extraLines?: { key: string; line: ChartLine[]; color: string; dash?: string; width?: number }[];
  trend?: TrendSample[];
  events?: ChartEvent[];
  xDomain: [Date, Date];
  formatTick: (at: Date) => string;
  formatValue: (v: number) => string;
  yLabel: string;
  children?: ReactNode;
}

const x = (p: { at: Date }) => p.at;
const y = (p: { value: number }) => p.value;

function yDomain(props: ControlChartProps): [number, number] {
  const values = props.points.map((p) => p.value);
  for (const s of props.stages ?? []) values.push(...(s.control ?? []));
  if (props.tolerance != null) values.push(props.tolerance, props.twoSided ? -props.tolerance : 0);
  for (const t of props.trend ?? []) values.push(t.fit);
  for (const l of props.extraLines ?? []) values.push(...l.line.map((p) => p.value));
  if (!values.length) values.push(0, 1);
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
      <StageLayer stages={props.stages ?? []} nonNegative={props.twoSided === false} />
      <RequirementLayer from={props.xDomain[0]} to={props.xDomain[1]} acceptance={props.acceptance ?? null} tolerance={props.tolerance ?? null} twoSided={props.twoSided ?? true} />
      <EventLayer events={props.events ?? []} />
      <TrendLayer samples={props.trend ?? []} />
      {props.extraLines?.map((l) => (l.line.length ? <LineSeries key={l.key} dataKey={l.key} data={l.line} xAccessor={x} yAccessor={y} stroke={l.color} strokeWidth={l.width ?? 1.5} strokeDasharray={l.dash} /> : null))}
      {props.ewma?.length ? <LineSeries dataKey="ewma" data={props.ewma} xAccessor={x} yAccessor={y} stroke="var(--color-signal)" strokeWidth={1.5} /> : null}
      {props.children}
      <GlyphSeries dataKey="points" data={props.points} xAccessor={x} yAccessor={y} renderGlyph={({ x: gx, y: gy, datum }) => <PointGlyph x={gx} y={gy} shape={datum.shape} />} />
      <GlyphSeries dataKey="signals" data={signalled} xAccessor={x} yAccessor={y} renderGlyph={({ x: gx, y: gy }) => <SignalGlyph x={gx} y={gy} />} />
      <Axis orientation="bottom" numTicks={6} tickFormat={(v: Date) => props.formatTick(v)} stroke="var(--color-ink-soft)" tickStroke="var(--color-ink-soft)" tickLabelProps={{ fill: "var(--color-ink-soft)", fontSize: 11 }} />
      <Axis orientation="left" numTicks={5} label={props.yLabel} labelOffset={40} tickFormat={(v: number) => props.formatValue(v)} stroke="var(--color-ink-soft)" tickStroke="var(--color-ink-soft)" tickLabelProps={{ fill: "var(--color-ink-soft)", fontSize: 11 }} labelProps={{ fill: "var(--color-ink)", fontSize: 12 }} />
      <Tooltip<ChartPoint | ChartLine>
        snapTooltipToDatumX
        snapTooltipToDatumY
        showVerticalCrosshair
        renderTooltip={({ tooltipData }) => {
          const candidate = tooltipData?.datumByKey.points?.datum ?? tooltipData?.nearestDatum?.datum;
          if (!candidate || !("tooltip" in candidate)) return null;
          const datum = candidate as ChartPoint;
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
