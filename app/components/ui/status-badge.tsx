import type { InstrumentStatus } from "../../../db/schema/enums";

const LABELS: Record<InstrumentStatus, string> = {
  in_service: "In service",
  out_of_service: "Out of service",
  retired: "Retired",
};

/** Status by shape and word first; colour only reinforces it. */
function Shape({ status }: { status: InstrumentStatus }) {
  if (status === "in_service") return <circle cx="6" cy="6" r="4.5" className="fill-within" />;
  if (status === "out_of_service")
    return (
      <g className="stroke-out" strokeWidth="1.6" fill="none">
        <rect x="1.5" y="1.5" width="9" height="9" />
        <path d="M3 3l6 6M9 3l-6 6" />
      </g>
    );
  return <path d="M1.5 6h9" className="stroke-ink-faint" strokeWidth="2" />;
}

export function StatusBadge({ status }: { status: InstrumentStatus }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm">
      <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true">
        <Shape status={status} />
      </svg>
      {LABELS[status]}
    </span>
  );
}
