import { Link, useLocation } from "react-router";

/** A column header that links to the same URL sorted by `column`; a second click reverses it. */
export function SortHeader({ column, label, sort, dir, className = "", param = "sort", dirParam = "dir", pageParam = "page" }: { column: string; label: string; sort: string; dir: "asc" | "desc"; className?: string; param?: string; dirParam?: string; pageParam?: string }) {
  const location = useLocation();
  const params = new URLSearchParams(location.search);
  const active = sort === column;
  params.set(param, column);
  params.set(dirParam, active && dir === "asc" ? "desc" : "asc");
  params.delete(pageParam);
  return (
    <th scope="col" aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : "none"} className={`px-3 py-2 text-left font-medium ${className}`}>
      <Link to={`?${params}`} preventScrollReset className="hover:text-accent">
        {label}
        <span aria-hidden="true" className="ml-1 text-ink-faint">
          {active ? (dir === "asc" ? "▲" : "▼") : "↕"}
        </span>
      </Link>
    </th>
  );
}
