import { Form, Link, useLocation } from "react-router";
import type { SeriesParams } from "~/lib/series-params";

const PRESETS = [
  ["90d", "90 days"],
  ["1y", "1 year"],
  ["all", "All"],
] as const;

/** The charts' time range, kept in the URL so a view can be shared. */
export function RangeControl({ params }: { params: SeriesParams }) {
  const location = useLocation();
  const href = (range: string) => {
    const next = new URLSearchParams(location.search);
    next.set("range", range);
    next.delete("from");
    next.delete("to");
    return `?${next}`;
  };
  return (
    <div className="flex flex-wrap items-end gap-3 text-sm" role="group" aria-label="Time range">
      {PRESETS.map(([value, label]) => (
        <Link key={value} to={href(value)} preventScrollReset aria-current={params.range === value ? "true" : undefined} className={`rounded-md border px-3 py-1.5 ${params.range === value ? "border-accent bg-accent-wash font-semibold text-accent-deep" : "border-rule bg-card hover:bg-paper-deep"}`}>
          {label}
        </Link>
      ))}
      <Form method="get" preventScrollReset className="flex items-end gap-2">
        <input type="hidden" name="range" value="custom" />
        <label className="flex flex-col gap-0.5"><span className="text-xs text-ink-soft">From</span><input type="date" name="from" defaultValue={params.from ?? ""} className="rounded-md border border-rule bg-card px-2 py-1" /></label>
        <label className="flex flex-col gap-0.5"><span className="text-xs text-ink-soft">To</span><input type="date" name="to" defaultValue={params.to ?? ""} className="rounded-md border border-rule bg-card px-2 py-1" /></label>
        <button type="submit" className={`rounded-md border px-3 py-1.5 ${params.range === "custom" ? "border-accent bg-accent-wash" : "border-rule bg-card"}`}>Custom range</button>
      </Form>
    </div>
  );
}
