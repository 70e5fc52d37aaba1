import type { ReactNode } from "react";
import { Link, useLocation } from "react-router";

/**
 * Previous / next links that keep every other URL parameter (filters, sort) and change only the page one.
 * Newest-first lists say "Newer" / "Older" instead; `summary` replaces the default "Page n of m". `keepScroll` for a
 * list inside a longer page (the checks under a chart), so turning its page does not jump to the top.
 */
export function Pager({ page, pages, label = "Pages", param = "page", previous = "Previous", next = "Next", summary, keepScroll = false, className = "mt-4" }: { page: number; pages: number; label?: string; param?: string; previous?: string; next?: string; summary?: ReactNode; keepScroll?: boolean; className?: string }) {
  const location = useLocation();
  const to = (n: number) => {
    const search = new URLSearchParams(location.search);
    search.set(param, String(n));
    return `?${search}`;
  };
  return (
    <nav aria-label={label} className={`flex items-center gap-3 text-sm ${className}`}>
      {page > 1 ? <Link to={to(page - 1)} preventScrollReset={keepScroll} className="text-accent underline">{previous}</Link> : null}
      <span className="num text-ink-soft">{summary ?? `Page ${page} of ${pages}`}</span>
      {page < pages ? <Link to={to(page + 1)} preventScrollReset={keepScroll} className="text-accent underline">{next}</Link> : null}
    </nav>
  );
}
