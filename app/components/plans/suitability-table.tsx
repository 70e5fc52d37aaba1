export interface SuitabilityRow {
  identifier: string;
  weightId: number;
  weightClass: string;
  nominalG: string;
  classMpeG: number | null;
  uncertaintyG: number;
  limitG: number | null;
  suitable: boolean;
  problems: string[];
  notes: string[];
}

// Weight errors are small: milligrams to three significant digits, as certificates print them.
const mass = (g: number | null) => (g === null ? "—" : `${Number((g * 1000).toPrecision(3))} mg`);

/** Each weight against the plan: class mpe and U beside T/3, the verdict in words and shape. */
export function SuitabilityTable({ rows, weightHref }: { rows: SuitabilityRow[]; weightHref: (id: number) => string }) {
  if (!rows.length) return <p className="text-sm text-ink-soft">No test weight is assigned.</p>;
  return (
    <table className="w-full text-sm">
      <thead className="text-ink-soft">
        <tr>
          <th scope="col" className="py-1 text-left font-medium">Weight</th>
          <th scope="col" className="py-1 text-right font-medium">Class mpe</th>
          <th scope="col" className="py-1 text-right font-medium">Certificate U</th>
          <th scope="col" className="py-1 text-right font-medium">T/3</th>
          <th scope="col" className="py-1 pl-4 text-left font-medium">May serve?</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.weightId} className="border-t border-rule/60 align-top">
            <td className="py-1"><a href={weightHref(r.weightId)} className="text-accent-deep underline">{r.identifier}</a> <span className="text-ink-faint">{r.weightClass}</span></td>
            <td className="num py-1 text-right">{mass(r.classMpeG)}</td>
            <td className="num py-1 text-right">{mass(r.uncertaintyG)}</td>
            <td className="num py-1 text-right">{mass(r.limitG)}</td>
            <td className="py-1 pl-4">
              <span className="inline-flex items-center gap-1.5 font-medium">
                <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true">{r.suitable ? <path d="M2 6.5 5 9.5 10 3" className="fill-none stroke-within" strokeWidth="2" /> : <path d="M2.5 2.5l7 7M9.5 2.5l-7 7" className="stroke-out" strokeWidth="2" />}</svg>
                {r.suitable ? "Yes" : "No"}
              </span>
              {r.problems.map((p) => <p key={p} className="text-out">{p}</p>)}
              {r.notes.map((n) => <p key={n} className="text-ink-soft">{n}</p>)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
