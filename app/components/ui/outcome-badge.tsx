import type { Outcome } from "~/lib/stats/requirement";

export const OUTCOME_LABELS: Record<Outcome, string> = {
  in_tolerance: "Within acceptance",
  guard_band: "In guard band",
  out_of_tolerance: "Out of tolerance",
};

/** The outcome's shape, drawn at (6, 6) in a 12 × 12 box; shared by badges, tables and charts. */
export function OutcomeShape({ outcome, size = 12 }: { outcome: Outcome; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 12 12" aria-hidden="true" className="shrink-0">
      {outcome === "in_tolerance" ? <circle cx="6" cy="6" r="4.5" className="fill-within" /> : null}
      {outcome === "guard_band" ? <path d="M6 1.2 10.8 6 6 10.8 1.2 6Z" className="fill-none stroke-guard" strokeWidth="1.6" /> : null}
      {outcome === "out_of_tolerance" ? (
        <g className="fill-none stroke-out" strokeWidth="1.6">
          <rect x="1.5" y="1.5" width="9" height="9" />
          <path d="M3 3l6 6M9 3l-6 6" />
        </g>
      ) : null}
    </svg>
  );
}

export function OutcomeBadge({ outcome }: { outcome: Outcome }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm">
      <OutcomeShape outcome={outcome} />
      {OUTCOME_LABELS[outcome]}
    </span>
  );
}
