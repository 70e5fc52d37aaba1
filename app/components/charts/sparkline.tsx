import { scaleLinear, scaleTime } from "@visx/scale";
import { useMemo } from "react";

/** One instrument's error as a fraction of its tolerance on a shared −1…+1 scale, with the tolerance edges drawn. */
export function Sparkline({ points, width, height, from, to, label }: { points: { at: string; value: number }[]; width: number; height: number; from: Date; to: Date; label: string }) {
  const { x, y } = useMemo(() => ({ x: scaleTime({ domain: [from, to], range: [2, width - 2] }), y: scaleLinear({ domain: [-1.2, 1.2], range: [height - 2, 2], clamp: true }) }), [from, to, width, height]);
  const path = points.map((p, i) => `${i ? "L" : "M"}${x(new Date(p.at)).toFixed(1)},${y(p.value).toFixed(1)}`).join("");
  const last = points.at(-1);
  return (
    <svg width={width} height={height} role="img" aria-label={label}>
      <rect x={0} y={y(1)} width={width} height={y(-1) - y(1)} className="fill-paper" />
      <line x1={0} x2={width} y1={y(1)} y2={y(1)} className="stroke-out" strokeWidth={1.5} />
      <line x1={0} x2={width} y1={y(-1)} y2={y(-1)} className="stroke-out" strokeWidth={1.5} />
      <line x1={0} x2={width} y1={y(0)} y2={y(0)} className="stroke-rule" />
      <path d={path} className="fill-none stroke-ink" strokeWidth={1} />
      {last ? <circle cx={x(new Date(last.at))} cy={y(last.value)} r={2.5} className={Math.abs(last.value) > 1 ? "fill-out" : "fill-within"} /> : null}
    </svg>
  );
}
