// Reference lines, shading and annotations drawn with the chart's own scales.
import { DataContext } from "@visx/xychart";
import { useContext } from "react";
import type { ChartEvent, ChartStage, TrendSample } from "./chart-types";

type Scale = (v: Date | number) => number | undefined;

function useScales() {
  const { xScale, yScale, margin, innerHeight, innerWidth } = useContext(DataContext);
  if (!xScale || !yScale || !margin) return null;
  return { x: xScale as unknown as Scale, y: yScale as unknown as Scale, top: margin.top, left: margin.left, bottom: margin.top + (innerHeight ?? 0), right: margin.left + (innerWidth ?? 0) };
}

function HLine({ from, to, value, className, dash, width = 1 }: { from: Date; to: Date; value: number; className: string; dash?: string; width?: number }) {
  const s = useScales();
  if (!s) return null;
  const y = s.y(value);
  if (y === undefined || y < s.top || y > s.bottom) return null;
  return <line x1={Math.max(s.left, s.x(from) ?? s.left)} x2={Math.min(s.right, s.x(to) ?? s.right)} y1={y} y2={y} className={className} strokeDasharray={dash} strokeWidth={width} />;
}

/** Statistical limits per stage; for sizes (s, |ΔI|) a limit below zero means nothing and is not drawn. */
export function StageLayer({ stages, nonNegative = false }: { stages: ChartStage[]; nonNegative?: boolean }) {
  const s = useScales();
  if (!s) return null;
  return (
    <g aria-hidden="true">
      {stages.map((stage, i) => (
        <g key={i}>
          {stage.baselineEnd ? <rect x={Math.max(s.left, s.x(stage.from) ?? s.left)} width={Math.max(0, (s.x(stage.baselineEnd) ?? 0) - Math.max(s.left, s.x(stage.from) ?? s.left))} y={s.top} height={s.bottom - s.top} className="fill-paper-deep" /> : null}
          {stage.center !== null ? <HLine from={stage.from} to={stage.to} value={stage.center} className="stroke-ink" /> : null}
          {stage.warning?.filter((v) => !nonNegative || v >= 0).map((v) => <HLine key={`w${v}`} from={stage.from} to={stage.to} value={v} className="stroke-ink" dash="1 3" />)}
          {stage.control?.filter((v) => !nonNegative || v >= 0).map((v) => <HLine key={`c${v}`} from={stage.from} to={stage.to} value={v} className="stroke-ink" dash="6 4" />)}
        </g>
      ))}
    </g>
  );
}

export function RequirementLayer({ from, to, acceptance, tolerance, twoSided }: { from: Date; to: Date; acceptance: number | null; tolerance: number | null; twoSided: boolean }) {
  const sides = twoSided ? [1, -1] : [1];
  return (
    <g aria-hidden="true">
      {acceptance !== null ? sides.map((k) => <HLine key={`a${k}`} from={from} to={to} value={k * acceptance} className="stroke-guard" width={1.5} />) : null}
      {tolerance !== null ? sides.map((k) => <HLine key={`t${k}`} from={from} to={to} value={k * tolerance} className="stroke-out" width={2.5} />) : null}
    </g>
  );
}

export function EventLayer({ events }: { events: ChartEvent[] }) {
  const s = useScales();
  if (!s) return null;
  return (
    <g aria-hidden="true">
      {events.map((e, i) => {
        const x = s.x(e.at);
        if (x === undefined || x < s.left || x > s.right) return null;
        return (
          <g key={i}>
            <line x1={x} x2={x} y1={s.top} y2={s.bottom} className="stroke-ink-faint" strokeDasharray="2 2" />
            <text x={x + 3} y={s.top + 10 + (i % 2) * 12} className="fill-ink-soft text-[10px]">{e.label}</text>
          </g>
        );
      })}
    </g>
  );
}

export function TrendLayer({ samples }: { samples: TrendSample[] }) {
  const s = useScales();
  if (!s || samples.length < 2) return null;
  const pts = (key: "fit" | "low" | "high") => samples.map((p) => `${s.x(p.at)},${s.y(p[key])}`);
  return (
    <g aria-hidden="true">
      <polygon points={[...pts("high"), ...pts("low").reverse()].join(" ")} className="fill-accent opacity-15" />
      <polyline points={pts("fit").join(" ")} className="fill-none stroke-accent" strokeWidth={1.5} />
    </g>
  );
}
