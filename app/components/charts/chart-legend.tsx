import { PointGlyph, SignalGlyph } from "./glyphs";

export type LegendItem = "within" | "guard" | "out" | "excluded" | "signal" | "center" | "warning" | "control" | "acceptance" | "tolerance" | "ewma" | "trend" | "event" | "baseline";

const LABELS: Record<LegendItem, string> = {
  within: "Within acceptance",
  guard: "In guard band",
  out: "Out of tolerance",
  excluded: "Excluded from statistics",
  signal: "Statistical signal",
  center: "Centre line",
  warning: "Warning limits ±2σ̂",
  control: "Control limits ±3σ̂",
  acceptance: "Acceptance limit",
  tolerance: "Tolerance limit",
  ewma: "EWMA",
  trend: "Trend and 95 % prediction band",
  event: "Event (resets the baseline)",
  baseline: "Baseline period",
};

function Swatch({ item }: { item: LegendItem }) {
  switch (item) {
    case "within":
    case "guard":
    case "out":
    case "excluded":
      return <PointGlyph x={9} y={7} shape={item} size={4.5} />;
    case "signal":
      return <SignalGlyph x={9} y={16} />;
    case "center":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-ink" />;
    case "warning":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-ink" strokeDasharray="1 3" />;
    case "control":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-ink" strokeDasharray="6 4" />;
    case "acceptance":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-guard" strokeWidth={1.5} />;
    case "tolerance":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-out" strokeWidth={2.5} />;
    case "ewma":
      return <line x1={0} x2={18} y1={7} y2={7} className="stroke-signal" strokeWidth={1.5} />;
    case "trend":
      return (
        <g>
          <rect x={0} y={2} width={18} height={10} className="fill-accent opacity-15" />
          <line x1={0} x2={18} y1={7} y2={7} className="stroke-accent" strokeWidth={1.5} />
        </g>
      );
    case "event":
      return <line x1={9} x2={9} y1={0} y2={14} className="stroke-ink-faint" strokeDasharray="2 2" />;
    case "baseline":
      return <rect x={0} y={1} width={18} height={12} className="fill-paper-deep stroke-rule" />;
  }
}

/** Names every line family and shape on the chart; never colour alone. */
export function ChartLegend({ items }: { items: LegendItem[] }) {
  return (
    <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft" aria-label="Legend">
      {items.map((item) => (
        <li key={item} className="inline-flex items-center gap-1.5">
          <svg width="18" height="14" aria-hidden="true">
            <Swatch item={item} />
          </svg>
          {LABELS[item]}
        </li>
      ))}
    </ul>
  );
}
