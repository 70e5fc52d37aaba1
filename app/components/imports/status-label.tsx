import type { ImportStatus } from "~/lib/csv-import-record";
import { STATUS_LABELS } from "~/lib/csv-import-record";

/** Import status by shape and word: a ring while it runs, a filled disc when imported, a crossed square otherwise. */
export function ImportStatusLabel({ status }: { status: ImportStatus }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm">
      <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true" className="shrink-0">
        {status === "done" ? <circle cx="6" cy="6" r="4.5" className="fill-within" /> : null}
        {status === "rejected" || status === "failed" ? (
          <g className="fill-none stroke-out" strokeWidth="1.6">
            <rect x="1.5" y="1.5" width="9" height="9" />
            <path d="M3 3l6 6M9 3l-6 6" />
          </g>
        ) : null}
        {status !== "done" && status !== "rejected" && status !== "failed" ? <circle cx="6" cy="6" r="4" className="fill-none stroke-accent" strokeWidth="1.6" /> : null}
      </svg>
      {STATUS_LABELS[status]}
    </span>
  );
}
