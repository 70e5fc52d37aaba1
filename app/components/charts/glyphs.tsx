import type { PointShape } from "./chart-types";

/** Outcome shapes (DESIGN.md §7): filled circle, hollow diamond, crossed square, grey ring; centred on (x, y). */
export function PointGlyph({ x, y, shape, size = 5 }: { x: number; y: number; shape: PointShape; size?: number }) {
  if (shape === "within") return <circle cx={x} cy={y} r={size * 0.8} className="fill-within" />;
  if (shape === "guard") return <path d={`M${x} ${y - size}L${x + size} ${y}L${x} ${y + size}L${x - size} ${y}Z`} className="fill-card stroke-guard" strokeWidth={1.6} />;
  if (shape === "out")
    return (
      <g className="stroke-out" strokeWidth={1.6} fill="none">
        <rect x={x - size} y={y - size} width={size * 2} height={size * 2} className="fill-card" />
        <path d={`M${x - size + 1.5} ${y - size + 1.5}L${x + size - 1.5} ${y + size - 1.5}M${x + size - 1.5} ${y - size + 1.5}L${x - size + 1.5} ${y + size - 1.5}`} />
      </g>
    );
  return <circle cx={x} cy={y} r={size * 0.8} className="fill-none stroke-excluded" strokeWidth={1.5} />;
}

/** A statistical signal: a small violet triangle above the point. */
export function SignalGlyph({ x, y }: { x: number; y: number }) {
  const top = y - 13;
  return <path d={`M${x} ${top + 6}L${x - 4} ${top}L${x + 4} ${top}Z`} className="fill-signal" />;
}
