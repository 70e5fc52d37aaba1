// Dates in the site's time zone; every axis and table states which zone it shows.
export function formatDay(at: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", { timeZone, day: "2-digit", month: "short", year: "numeric" }).format(new Date(at));
}

export function formatDateTime(at: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", { timeZone, day: "2-digit", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hour12: false }).format(new Date(at));
}

export function formatTick(at: Date, timeZone: string, spanDays: number): string {
  const options: Intl.DateTimeFormatOptions = spanDays > 400 ? { month: "short", year: "2-digit" } : { day: "numeric", month: "short" };
  return new Intl.DateTimeFormat("en-GB", { timeZone, ...options }).format(at);
}

/** "in 38 days" / "12 days ago" from now, for forecast dates. */
export function relativeDays(at: Date | string, now: Date): string {
  const days = Math.round((new Date(at).getTime() - now.getTime()) / 86_400_000);
  if (days === 0) return "today";
  return days > 0 ? `in ${days} day${days === 1 ? "" : "s"}` : `${-days} day${days === -1 ? "" : "s"} ago`;
}
