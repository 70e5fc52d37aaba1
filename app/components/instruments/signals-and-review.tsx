import { formatDay } from "~/lib/format";
import { describeSignal } from "~/lib/signal-advice";
import type { InstrumentSeries } from "~/queries/series.server";

const RECOMMENDATION = { extend: "Extend the interval", keep: "Keep the interval", shorten: "Shorten the interval" } as const;

export function SignalsList({ series }: { series: InstrumentSeries }) {
  const recent = series.signals.slice(-8).reverse();
  return (
    <section className="rounded-md border border-rule bg-card p-4" aria-label={`Signals, ${series.type}`}>
      <h3 className="font-semibold">Signals in the current stage</h3>
      {recent.length === 0 ? (
        <p className="mt-1 text-sm text-ink-soft">No statistical signal since the latest reset.</p>
      ) : (
        <ul className="mt-2 grid gap-2 text-sm">
          {recent.map((s, i) => {
            const words = describeSignal(s.rule);
            return (
              <li key={`${s.rule}-${s.index}-${i}`} className="flex gap-2">
                <svg width="10" height="10" viewBox="0 0 10 10" aria-hidden="true" className="mt-1 shrink-0"><path d="M5 9 1 2h8Z" className="fill-signal" /></svg>
                <span>
                  <strong className="font-medium">{words.name}</strong> {s.at ? `on ${formatDay(s.at, series.instrument.timeZone)}` : ""} ({s.rule}). {words.advice}
                </span>
              </li>
            );
          })}
        </ul>
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
