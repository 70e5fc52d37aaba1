import type { ReactNode } from "react";

export function PageHeader({ title, subtitle, action }: { title: string; subtitle?: ReactNode; action?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-4">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
        {subtitle ? <p className="mt-1 text-sm text-ink-soft">{subtitle}</p> : null}
      </div>
      {action}
    </header>
  );
}

export function Caution({ children }: { children: ReactNode }) {
  return (
    <aside className="rounded-md border border-guard/50 bg-paper-deep px-4 py-3 text-sm text-ink-soft">
      <strong className="font-semibold text-ink">Caution. </strong>
      {children}
    </aside>
  );
}
