import { formatDay } from "~/lib/format";
import { describeSignal } from "~/lib/signal-advice";
import type { InstrumentSeries } from "~/queries/series.server";

const RECOMMENDATION = { extend: "Extend the interval", keep: "Keep the interval", shorten: "Shorten the interval" } as const;

/** Signals of the current stage grouped by rule: how often, the latest date, and what to do next. */
export function SignalsList({ series }: { series: InstrumentSeries }) {
  const zone = series.instrument.timeZone;
  const groups = new Map<string, { count: number; last: string | null }>();
  for (const s of series.signals) {
    const g = groups.get(s.rule) ?? { count: 0, last: null };
    groups.set(s.rule, { count: g.count + 1, last: s.at ?? g.last });
  }
  const rows = [...groups.entries()].sort((a, b) => String(b[1].last).localeCompare(String(a[1].last)));
  const advice = [...new Set(rows.map(([rule]) => describeSignal(rule).advice))];
  return (
    <section className="rounded-md border border-rule bg-card p-4" aria-label={`Signals, ${series.type}`}>
      <h3 className="font-semibold">Signals in the current stage</h3>
      {rows.length === 0 ? (
        <p className="mt-1 text-sm text-ink-soft">No statistical signal since the latest reset.</p>
      ) : (
        <>
          <ul className="mt-2 grid gap-1 text-sm">
            {rows.map(([rule, g]) => (
              <li key={rule} className="flex gap-2">
                <svg width="10" height="10" viewBox="0 0 10 10" aria-hidden="true" className="mt-1 shrink-0"><path d="M5 9 1 2h8Z" className="fill-signal" /></svg>
                <span>
                  {describeSignal(rule).name} <span className="text-ink-soft">({rule}; {g.count === 1 ? "once" : `${g.count} episodes`}, latest {g.last ? formatDay(g.last, zone) : "—"})</span>
                </span>
              </li>
            ))}
          </ul>
          <h4 className="mt-3 text-sm font-semibold">What to do next</h4>
          <ul className="mt-1 list-disc pl-5 text-sm text-ink-soft">{advice.map((a) => <li key={a}>{a}</li>)}</ul>
        </>
      )}
    </section>
  );
}

export function ReviewBox({ series }: { series: InstrumentSeries }) {
  if (!series.review) return null;
  return (
    <section className="rounded-md border border-rule bg-card p-4" aria-label={`Interval review, ${series.type}`}>
      <h3 className="font-semibold">Interval review: {RECOMMENDATION[series.review.recommendation]}</h3>
      <p className="mt-1 text-sm text-ink-soft">{series.review.reason}</p>
    </section>
  );
}
