import { FIELD_LABELS, IMPORT_FIELDS, type ColumnMapping, type ImportField } from "~/lib/csv-mapping";

/** The file's first rows under its own header, with a choice of Tareline field above each column. */
export function PreviewTable({ labels, rows, mapping, onChange }: { labels: string[]; rows: string[][]; mapping: ColumnMapping; onChange: (label: string, field: ImportField | "") => void }) {
  return (
    <div className="overflow-x-auto rounded-md border border-rule bg-card">
      <table className="w-full text-sm">
        <caption className="sr-only">The first rows of the file and the Tareline field each column is imported as</caption>
        <thead className="border-b border-rule bg-paper-deep/50">
          <tr>
            {labels.map((label, i) => (
              <th key={label} scope="col" className="min-w-36 px-3 py-2 text-left align-top font-medium">
                <label className="grid gap-1">
                  <span className="text-ink">{label}</span>
                  <select
                    name={`map:${i}`}
                    value={mapping[label] ?? ""}
                    onChange={(e) => onChange(label, e.currentTarget.value as ImportField | "")}
                    aria-label={`Import column ${label} as`}
                    className="rounded-md border border-rule bg-card px-2 py-1 text-sm font-normal"
                  >
                    <option value="">Not imported</option>
                    {IMPORT_FIELDS.map((f) => <option key={f} value={f}>{FIELD_LABELS[f]}</option>)}
                  </select>
                </label>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row, r) => (
            <tr key={r} className="border-b border-rule/60 last:border-0">
              {labels.map((label, i) => <td key={label} className={`num whitespace-pre-wrap px-3 py-1.5 ${mapping[label] ? "" : "text-ink-faint"}`}>{row[i] ?? ""}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      {rows.length === 0 ? <p className="p-4 text-ink-soft">The file has a header line but no rows after it.</p> : null}
    </div>
  );
}
