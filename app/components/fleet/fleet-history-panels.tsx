import { Link } from "react-router";
import { Sparkline } from "~/components/charts/sparkline";
import { OutcomeShape, OUTCOME_LABELS } from "~/components/ui/outcome-badge";
import { useFleetHistoryQuery } from "~/hooks/use-fleet-history-query";

/** Small multiples (each instrument's E ÷ T, −1…+1) and the instruments × weeks heat map by worst outcome. */
export function FleetHistoryPanels({ ids, now }: { ids: number[]; now: Date }) {
  const { data, error, isPending } = useFleetHistoryQuery(ids);
  if (isPending) return <p className="text-sm text-ink-soft">Loading the fleet's recent history…</p>;
  if (error) return <p role="alert" className="text-sm text-out">{error.message}</p>;
  const from = new Date(now.getTime() - 90 * 86_400_000);
  const withData = data.instruments.filter((i) => i.normalised.length > 0);
  return (
    <div className="grid gap-6">
      <section aria-labelledby="multiples-heading" className="rounded-md border border-rule bg-card p-4">
        <h2 id="multiples-heading" className="font-semibold">Sensitivity error as a share of tolerance, last 90 days</h2>
        <p className="text-sm text-ink-soft">The instruments of the table above, in its order. Each on one scale: the heavy vermilion lines are its tolerance (±1). A line heading for an edge is an instrument heading for a failure.</p>
        <ul className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5 xl:grid-cols-6">
          {withData.map((i) => {
            const last = i.normalised.at(-1)!;
            return (
              <li key={i.id} className="rounded border border-rule/70 p-2">
                <Link to={`/instruments/${i.id}`} className="text-xs font-medium text-accent-deep underline-offset-2 hover:underline">{i.assetTag}</Link>
                <Sparkline points={i.normalised} width={150} height={44} from={from} to={now} label={`${i.assetTag}: latest error ${(last.value * 100).toFixed(0)} % of tolerance`} />
                <p className="num text-[11px] text-ink-soft">latest {(last.value * 100).toFixed(0)} % of T</p>
              </li>
            );
          })}
        </ul>
      </section>
      <section aria-labelledby="heatmap-heading" className="rounded-md border border-rule bg-card p-4">
        <h2 id="heatmap-heading" className="font-semibold">Worst outcome per week, last 12 weeks</h2>
        <div className="mt-2 overflow-x-auto">
          <table className="text-xs">
            <thead>
              <tr>
                <th scope="col" className="pr-3 text-left font-medium">Instrument</th>
                {data.weeks.map((w) => <th key={w} scope="col" className="px-1 font-normal text-ink-soft">{w.slice(5)}</th>)}
              </tr>
            </thead>
            <tbody>
              {data.instruments.map((i) => (
                <tr key={i.id}>
                  <th scope="row" className="pr-3 text-left font-normal">{i.assetTag}</th>
                  {i.weekly.map((o, w) => (
                    <td key={w} className="px-1 py-0.5 text-center" title={o ? `${i.assetTag}, week of ${data.weeks[w]}: ${OUTCOME_LABELS[o]}` : `${i.assetTag}, week of ${data.weeks[w]}: no check`}>
                      {o ? <span className="inline-flex"><OutcomeShape outcome={o} size={11} /><span className="sr-only">{OUTCOME_LABELS[o]}</span></span> : <span className="text-ink-faint" aria-label="no check">·</span>}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}
