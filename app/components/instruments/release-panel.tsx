import { Form } from "react-router";
import { Button } from "~/components/ui/button";
import { RELEASE_EVENTS } from "~/lib/events";

interface Review {
  openedAt: string | Date;
  checkType: string;
  lastPassingAt: string | Date | null;
  checksSince: number;
  daysOfUse: number;
}

const day = (d: string | Date) => new Date(d).toISOString().slice(0, 10);

/** Shown while the instrument is out of service: the impact review, and the release form for a metrologist. */
export function ReleasePanel({ review, canRelease, errors }: { review: Review | null; canRelease: boolean; errors: string[] }) {
  return (
    <section aria-labelledby="oos-heading" className="mb-6 rounded-md border-2 border-out bg-card p-4">
      <h2 id="oos-heading" className="font-semibold">Out of service: do not use this instrument</h2>
      {review ? (
        <p className="mt-1 text-sm text-ink-soft">
          Impact review open since {day(review.openedAt)}:{" "}
          {review.lastPassingAt
            ? `${review.checksSince} check(s) and ${review.daysOfUse} day(s) of use since the last passing ${review.checkType} check on ${day(review.lastPassingAt)}.`
            : `no earlier passing ${review.checkType} check is recorded, so every weighing since the instrument entered service is in question.`}{" "}
          Assess the weighings made in that period under your quality system.
        </p>
      ) : null}
      {canRelease ? (
        <Form method="post" className="mt-4 grid max-w-2xl gap-3 text-sm">
          <input type="hidden" name="intent" value="release" />
          <label className="flex flex-col gap-1">
            <span className="font-medium">What brought it back</span>
            <select name="event" className="w-56 rounded-md border border-rule bg-card px-2 py-1.5">
              {RELEASE_EVENTS.map((e) => <option key={e} value={e}>{e[0].toUpperCase() + e.slice(1)}</option>)}
            </select>
          </label>
          <label className="flex flex-col gap-1">
            <span className="font-medium">Reason for release</span>
            <input name="reason" required className="rounded-md border border-rule bg-card px-2 py-1.5" />
          </label>
          <label className="flex flex-col gap-1">
            <span className="font-medium">Impact review conclusion</span>
            <textarea name="conclusion" required rows={2} className="rounded-md border border-rule bg-card px-2 py-1.5" />
          </label>
          {errors.length ? <p role="alert" className="text-out">{errors.join(" ")}</p> : null}
          <div><Button type="submit">Release to service</Button></div>
        </Form>
      ) : null}
    </section>
  );
}
