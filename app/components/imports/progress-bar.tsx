import { useId } from "react";

/** A labelled progress bar; without a known total it says so instead of guessing a width. */
export function ProgressBar({ label, value, max, detail }: { label: string; value: number; max: number | null; detail?: string }) {
  const fraction = max && max > 0 ? Math.min(1, value / max) : null;
  const percent = fraction === null ? null : Math.round(fraction * 100);
  const id = useId();
  return (
    <div className="grid gap-1">
      <div className="flex justify-between text-sm">
        <span id={id} className="font-medium">{label}</span>
        <span className="num text-ink-soft">{percent === null ? "working…" : `${percent} %`}</span>
      </div>
      <div
        role="progressbar"
        aria-labelledby={id}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent ?? undefined}
        aria-valuetext={detail}
        className="h-3 overflow-hidden rounded-full border border-rule bg-paper-deep"
      >
        <div className={`h-full bg-accent transition-[width] duration-300 ${percent === null ? "w-1/3 animate-pulse" : ""}`} style={percent === null ? undefined : { width: `${percent}%` }} />
      </div>
      {detail ? <p className="num text-xs text-ink-faint">{detail}</p> : null}
    </div>
  );
}
