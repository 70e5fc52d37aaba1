import type { compareSites } from "~/queries/fleet-overview.server";

export function SiteComparison({ sites }: { sites: ReturnType<typeof compareSites> }) {
  return (
    <section aria-labelledby="sites-heading" className="rounded-md border border-rule bg-card p-4">
      <h2 id="sites-heading" className="font-semibold">Sites compared, last 90 days</h2>
      <table className="mt-2 w-full text-sm">
        <thead className="text-ink-soft">
          <tr>
            {["Site", "Instruments", "Checks within acceptance", "Failures", "Overdue plans", "With active signals", "Out of service"].map((h, i) => <th key={h} scope="col" className={`px-2 py-1 font-medium ${i ? "text-right" : "text-left"}`}>{h}</th>)}
          </tr>
        </thead>
        <tbody>
          {sites.map((s) => (
            <tr key={s.site} className="border-t border-rule/60">
              <th scope="row" className="px-2 py-1 text-left font-medium">{s.site}</th>
              <td className="num px-2 py-1 text-right">{s.instruments}</td>
              <td className="num px-2 py-1 text-right">{s.checks90 ? `${((100 * s.inTolerance90) / s.checks90).toFixed(1)} % of ${s.checks90}` : "—"}</td>
              <td className="num px-2 py-1 text-right">{s.failures90}</td>
              <td className="num px-2 py-1 text-right">{s.overdue}</td>
              <td className="num px-2 py-1 text-right">{s.withSignals}</td>
              <td className="num px-2 py-1 text-right">{s.outOfService}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
