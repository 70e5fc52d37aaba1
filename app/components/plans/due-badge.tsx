import { DUE_STATE_LABELS, type DueState } from "~/lib/schedule";

const FILLED: Record<DueState, number> = { overdue: 3, due_today: 2, due_this_week: 1, later: 0 };
const TONE: Record<DueState, string> = { overdue: "fill-out stroke-out", due_today: "fill-accent stroke-accent", due_this_week: "fill-ink-soft stroke-ink-soft", later: "fill-none stroke-ink-faint" };

/** Urgency as a three-bar gauge and a word; colour only repeats what the bars say. */
export function DueBadge({ state, daysOverdue = 0 }: { state: DueState; daysOverdue?: number }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm">
      <svg width="14" height="12" viewBox="0 0 14 12" aria-hidden="true" className="shrink-0">
        {[0, 1, 2].map((i) => (
          <rect key={i} x={1 + i * 4.5} y={8 - i * 3} width="3" height={3 + i * 3} strokeWidth="1" className={i < FILLED[state] ? TONE[state] : "fill-none stroke-ink-faint"} />
        ))}
      </svg>
      {DUE_STATE_LABELS[state]}
      {state === "overdue" && daysOverdue > 0 ? <span className="num text-ink-soft">({daysOverdue} d)</span> : null}
    </span>
  );
}

export const CHECK_TYPE_LABELS = { sensitivity: "Sensitivity", repeatability: "Repeatability", eccentricity: "Eccentricity" } as const;
