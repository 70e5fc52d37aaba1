import type { ReactNode } from "react";

export function PrintHeader({ title, subtitle, printedAt }: { title: string; subtitle: ReactNode; printedAt: string }) {
  return (
    <header className="mb-4 flex items-start justify-between gap-6 border-b-2 border-ink pb-3">
      <div>
        <p className="text-xs font-semibold uppercase tracking-wide text-accent-deep">Tareline</p>
        <h1>{title}</h1>
        <p className="text-ink-soft">{subtitle}</p>
      </div>
      <div className="text-right text-xs text-ink-soft">
        <p>Printed {printedAt}</p>
        <button type="button" onClick={() => window.print()} className="no-print mt-2 rounded-md border border-rule bg-card px-3 py-1.5 text-sm text-ink">Print</button>
      </div>
    </header>
  );
}

/** Two signature lines that never split across pages. */
export function SignatureBlock({ left, right }: { left: string; right: string }) {
  return (
    <section className="print-signatures" aria-label="Signatures">
      <div><p className="font-medium">{left}</p><p className="print-note">Name, signature, date</p></div>
      <div><p className="font-medium">{right}</p><p className="print-note">Name, signature, date</p></div>
    </section>
  );
}

export function PrintCaution() {
  return (
    <p className="print-note mt-6">
      This record supports, and does not replace, calibration by an accredited provider, the site's quality system, legal-metrology rules for
      trade use and the maker's instructions. Times are shown in the site's time zone and in UTC.
    </p>
  );
}
