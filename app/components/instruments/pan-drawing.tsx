const POSITIONS = [
  { key: "backLeft", label: "Back left", x: 60, y: 45 },
  { key: "backRight", label: "Back right", x: 240, y: 45 },
  { key: "centre", label: "Centre", x: 150, y: 100 },
  { key: "frontLeft", label: "Front left", x: 60, y: 155 },
  { key: "frontRight", label: "Front right", x: 240, y: 155 },
] as const;

/** The latest eccentricity check drawn on the pan: ΔI at each corner relative to the centre reading. */
export function PanDrawing({ deviations, worst, format, when }: { deviations: Record<string, number>; worst: string; format: (g: number) => string; when: string }) {
  return (
    <figure className="rounded-md border border-rule bg-card p-4">
      <figcaption className="font-semibold">Latest eccentricity check on the pan</figcaption>
      <p className="text-sm text-ink-soft">{when}. ΔI = reading at the position − reading at the centre; the largest is in bold.</p>
      <svg viewBox="0 0 300 210" className="mt-2 w-full max-w-sm" role="img" aria-label={POSITIONS.filter((p) => p.key !== "centre").map((p) => `${p.label} ${format(deviations[p.key] ?? 0)}`).join(", ")}>
        <rect x="6" y="6" width="288" height="198" rx="28" className="fill-paper-deep stroke-ink-soft" strokeWidth="1.5" />
        <text x="150" y="200" textAnchor="middle" className="fill-ink-faint text-[9px]">front (operator side)</text>
        {POSITIONS.map((p) => (
          <g key={p.key}>
            <circle cx={p.x} cy={p.y - 4} r="24" className={p.key === worst ? "fill-card stroke-ink" : "fill-card stroke-rule"} strokeWidth={p.key === worst ? 2 : 1} />
            <text x={p.x} y={p.y + 32} textAnchor="middle" className="fill-ink-soft text-[10px]">{p.label}</text>
            <text x={p.x} y={p.y} textAnchor="middle" className={`fill-ink text-[11px] ${p.key === worst ? "font-bold" : ""}`}>{p.key === "centre" ? "ref." : format(deviations[p.key] ?? 0)}</text>
          </g>
        ))}
      </svg>
    </figure>
  );
}
