// Due dates live in the site's calendar: a plan "every 7 days" checked on a site's Monday is due on its next Monday,
// whatever the UTC offset or month length. Pure: the clock and the time zone are parameters.
export type DueState = "overdue" | "due_today" | "due_this_week" | "later";

export const DUE_STATE_LABELS: Record<DueState, string> = {
  overdue: "Overdue",
  due_today: "Due today",
  due_this_week: "Due this week",
  later: "Later",
};

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit", hourCycle: "h23" });
    formatters.set(timeZone, f);
  }
  return f;
}

function parts(instant: Date, timeZone: string) {
  const p = Object.fromEntries(formatter(timeZone).formatToParts(instant).map((x) => [x.type, x.value]));
  return { date: `${p.year}-${p.month}-${p.day}`, time: `${p.hour}:${p.minute}`, hour: Number(p.hour), seconds: Number(p.second) };
}

/** The calendar date (YYYY-MM-DD) of an instant in an IANA time zone. */
export function localDate(instant: Date, timeZone: string): string {
  return parts(instant, timeZone).date;
}

/** "YYYY-MM-DD HH:mm" of an instant in an IANA time zone. */
export function localDateTime(instant: Date, timeZone: string): string {
  const p = parts(instant, timeZone);
  return `${p.date} ${p.time}`;
}

/** The hour (0–23) of an instant in an IANA time zone. */
export function localHour(instant: Date, timeZone: string): number {
  return parts(instant, timeZone).hour;
}

const toUtcDay = (date: string) => Date.UTC(Number(date.slice(0, 4)), Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10)));

/** Calendar arithmetic on YYYY-MM-DD dates: no clock, no offset, month and year ends included. */
export function addDays(date: string, days: number): string {
  return new Date(toUtcDay(date) + days * 86_400_000).toISOString().slice(0, 10);
}

/** Whole calendar days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((toUtcDay(to) - toUtcDay(from)) / 86_400_000);
}

/** ISO weekday of a calendar date: 1 = Monday … 7 = Sunday. */
export function isoWeekday(date: string): number {
  return ((new Date(toUtcDay(date)).getUTCDay() + 6) % 7) + 1;
}

export interface PlanDue {
  /** The site-local day on which the next check falls due. */
  dueOn: string;
  today: string;
  state: DueState;
  /** Days past the due date (0 when not overdue). */
  daysOverdue: number;
  /** True when no valid check has been recorded under the plan: it is due from the day the plan was made. */
  neverChecked: boolean;
}

/** Due date = site-local day of the last valid check + interval; never checked → due on the plan's first day. Overdue from the day after. */
export function planDue(input: { lastValidAt: Date | null; planCreatedAt: Date; intervalDays: number; timeZone: string; now: Date }): PlanDue {
  const today = localDate(input.now, input.timeZone);
  const neverChecked = input.lastValidAt === null;
  const dueOn = neverChecked ? localDate(input.planCreatedAt, input.timeZone) : addDays(localDate(input.lastValidAt!, input.timeZone), input.intervalDays);
  const lateBy = daysBetween(dueOn, today);
  const state: DueState = lateBy > 0 ? "overdue" : lateBy === 0 ? "due_today" : lateBy >= -6 ? "due_this_week" : "later";
  return { dueOn, today, state, daysOverdue: Math.max(0, lateBy), neverChecked };
}

/** The days a plan's checks fall on within [today, today + days): an overdue plan counts as due today, then every interval. */
export function occurrences(due: Pick<PlanDue, "dueOn" | "today">, intervalDays: number, days = 56): string[] {
  const end = addDays(due.today, days);
  const out: string[] = [];
  let next = daysBetween(due.dueOn, due.today) > 0 ? due.today : due.dueOn;
  for (let guard = 0; daysBetween(next, end) > 0 && guard < 1000; guard++) {
    out.push(next);
    next = addDays(next, Math.max(1, intervalDays));
  }
  return out;
}

/** The Mondays of `weeks` calendar weeks starting with the week that holds `today`. */
export function weekStarts(today: string, weeks = 8): string[] {
  const monday = addDays(today, 1 - isoWeekday(today));
  return Array.from({ length: weeks }, (_, i) => addDays(monday, 7 * i));
}
