import { Link } from "react-router";
import { CHECK_TYPE_LABELS, DueBadge } from "~/components/plans/due-badge";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { addDays, daysBetween, occurrences, weekStarts } from "~/lib/schedule";
import { listPlanSchedule } from "~/queries/schedule.server";
import type { Route } from "./+types/schedule";

export const meta = () => [{ title: "Schedule · Tareline" }];

const WEEKS = 8;
const DAY_NAMES = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];

// The next eight weeks per site, projected from each plan's due date in the site's own calendar.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view");
  const site = Number(new URL(request.url).searchParams.get("site")) || undefined;
  const plans = await listPlanSchedule(db(), viewer, new Date(), { siteId: site });
  const bySite = new Map<number, { id: number; code: string; timeZone: string; today: string; plans: typeof plans }>();
  for (const p of plans) {
    const entry = bySite.get(p.siteId) ?? { id: p.siteId, code: p.siteCode, timeZone: p.timeZone, today: p.due.today, plans: [] };
    entry.plans.push(p);
    bySite.set(p.siteId, entry);
  }
  return {
    sites: [...bySite.values()].map((s) => {
      const weeks = weekStarts(s.today, WEEKS);
      const perDay = new Map<string, number>();
      const rows = s.plans.map((p) => {
        const days = occurrences(p.due, p.intervalDays, daysBetween(s.today, addDays(weeks[0], WEEKS * 7)));
        for (const d of days) perDay.set(d, (perDay.get(d) ?? 0) + 1);
        return { planId: p.planId, assetTag: p.assetTag, instrumentId: p.instrumentId, checkType: p.checkType, intervalDays: p.intervalDays, due: p.due, perWeek: weeks.map((w) => days.filter((d) => d >= w && d < addDays(w, 7))) };
      });
      const counts = { overdue: 0, due_today: 0, due_this_week: 0, later: 0 };
      for (const p of s.plans) counts[p.due.state]++;
      return { id: s.id, code: s.code, timeZone: s.timeZone, today: s.today, weeks, calendar: weeks.map((w) => DAY_NAMES.map((_, i) => ({ date: addDays(w, i), count: perDay.get(addDays(w, i)) ?? 0 }))), rows, counts };
    }),
  };
}

export default function Schedule({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Schedule" subtitle="Due dates fall on each site's own calendar. An overdue plan is shown as due today, then every interval after." action={<span className="flex gap-4 text-sm"><Link to="/checks-due" className="text-accent underline">Due today</Link><Link to="/plans" className="text-accent underline">All check plans</Link></span>} />
      {loaderData.sites.length === 0 ? <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">No active plans on in-service instruments at your sites.</p> : null}
      {loaderData.sites.map((s) => (
        <section key={s.id} aria-labelledby={`site-${s.id}`} className="mb-10">
          <h2 id={`site-${s.id}`} className="text-lg font-semibold">{s.code} · today {s.today} ({s.timeZone})</h2>
          <p className="mb-3 flex flex-wrap gap-5 text-sm" aria-label={`Counts at ${s.code}`}>
            <DueBadge state="overdue" /> <span className="num -ml-3 font-semibold">{s.counts.overdue}</span>
            <DueBadge state="due_today" /> <span className="num -ml-3 font-semibold">{s.counts.due_today}</span>
            <DueBadge state="due_this_week" /> <span className="num -ml-3 font-semibold">{s.counts.due_this_week}</span>
          </p>
          <table className="mb-4 w-full max-w-3xl rounded-md border border-rule bg-card text-sm">
            <caption className="sr-only">Checks falling due per day at {s.code}, next 8 weeks</caption>
            <thead className="text-ink-soft"><tr><th scope="col" className="px-2 py-1 text-left font-medium">Week of</th>{DAY_NAMES.map((d) => <th key={d} scope="col" className="px-2 py-1 text-right font-medium">{d}</th>)}</tr></thead>
            <tbody>
              {s.calendar.map((week, i) => (
                <tr key={s.weeks[i]} className="border-t border-rule/60">
                  <th scope="row" className="num px-2 py-1 text-left font-normal">{s.weeks[i]}</th>
                  {week.map((day) => <td key={day.date} className={`num px-2 py-1 text-right ${day.date === s.today ? "bg-accent-wash font-semibold" : day.date < s.today ? "text-ink-faint" : ""}`} title={day.date}>{day.date < s.today ? "" : day.count || "·"}</td>)}
                </tr>
              ))}
            </tbody>
          </table>
          <details>
            <summary className="cursor-pointer text-sm font-medium">Timeline per plan ({s.rows.length})</summary>
            <table className="mt-2 w-full rounded-md border border-rule bg-card text-sm">
              <thead className="text-ink-soft"><tr><th scope="col" className="px-2 py-1 text-left font-medium">Plan</th><th scope="col" className="px-2 py-1 text-left font-medium">Status</th>{s.weeks.map((w) => <th key={w} scope="col" className="num px-2 py-1 text-left font-medium">{w.slice(5)}</th>)}</tr></thead>
              <tbody>
                {s.rows.map((r) => (
                  <tr key={r.planId} className="border-t border-rule/60">
                    <td className="px-2 py-1"><Link to={`/plans/${r.planId}`} className="text-accent-deep underline">{r.assetTag} · {CHECK_TYPE_LABELS[r.checkType]}</Link></td>
                    <td className="px-2 py-1"><DueBadge state={r.due.state} daysOverdue={r.due.daysOverdue} /></td>
                    {r.perWeek.map((days, i) => <td key={i} className="num px-2 py-1">{days.length === 0 ? "" : days.length > 2 ? `${days.length}×` : days.map((d) => DAY_NAMES[(new Date(`${d}T00:00:00Z`).getUTCDay() + 6) % 7]).join(" ")}</td>)}
                  </tr>
                ))}
              </tbody>
            </table>
          </details>
        </section>
      ))}
    </>
  );
}
