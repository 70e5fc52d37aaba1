import { data, Form, Link, useSearchParams } from "react-router";
import { z } from "zod";
import { Button, ButtonLink } from "~/components/ui/button";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { StatusBadge } from "~/components/ui/status-badge";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { KIND_LABELS } from "~/lib/instrument-form";
import { can } from "~/lib/permissions";
import { formatMass, naturalUnit } from "~/lib/units";
import { getInstrumentPage } from "~/queries/instruments.server";
import { RELEASE_EVENTS } from "~/lib/events";
import { openImpactReview, recentChecks, releaseInstrument } from "~/queries/instrument-history.server";
import { CHECK_TYPES } from "../../db/schema/enums";
import type { Route } from "./+types/instrument-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data?.instrument.assetTag ?? "Instrument"} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, Number(params.id));
  const [checks, review] = await Promise.all([recentChecks(db(), instrument.id), openImpactReview(db(), instrument.id)]);
  return {
    instrument,
    checks,
    review,
    canEdit: can(viewer, "manage_instruments", instrument.siteId),
    canRecord: can(viewer, "record_check", instrument.siteId),
    canRelease: can(viewer, "review_points", instrument.siteId),
  };
}

const ReleaseSchema = z.object({
  event: z.enum(RELEASE_EVENTS, { error: "Choose what brought the instrument back: repair, adjustment or calibration." }),
  reason: z.string().trim().min(5, "Say why the instrument may be used again (at least a few words)."),
  conclusion: z.string().trim().min(5, "Record the conclusion of the impact review."),
});

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, Number(params.id));
  if (!can(viewer, "review_points", instrument.siteId)) throw forbiddenPage("Only a metrologist can release an instrument to service.");
  const parsed = ReleaseSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) return data({ errors: parsed.error.issues.map((i) => i.message) }, { status: 400 });
  const event = await releaseInstrument(db(), viewer, { instrumentId: instrument.id, ...parsed.data });
  if (!event) return data({ errors: ["The instrument is not out of service."] }, { status: 409 });
  return { errors: [] as string[], released: true };
}

const TYPE_LABELS = { sensitivity: "Sensitivity", repeatability: "Repeatability", eccentricity: "Eccentricity" } as const;

export default function InstrumentDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { instrument: i, checks, review, canEdit, canRecord, canRelease } = loaderData;
  const [search] = useSearchParams();
  const recorded = Number(search.get("recorded")) || null;
  const recordedCheck = checks.find((c) => c.id === recorded);
  const mass = (g: string | null) => (g ? formatMass(g, naturalUnit(g)) : "—");
  const result = (g: number) => formatMass(g, i.displayUnit, i.readabilityG);
  const properties: [string, string][] = [
    ["Kind", KIND_LABELS[i.kind]],
    ["Max", mass(i.capacityG)],
    ["d (readability)", mass(i.readabilityG)],
    ["e (verification interval)", mass(i.verificationIntervalG)],
    ["Accuracy class", i.accuracyClass ? `Class ${i.accuracyClass}` : "Not a legal-metrology instrument"],
    ["Smallest net weight used", mass(i.smallestNetWeightG)],
    ["Risk level", i.riskLevel],
    ["Site", `${i.siteCode} · ${i.siteName}`],
    ["Room", i.roomName ?? "—"],
    ["Serial number", i.serialNumber || "—"],
  ];
  return (
    <>
      <PageHeader
        title={i.assetTag}
        subtitle={<span className="inline-flex items-center gap-3">{i.description || KIND_LABELS[i.kind]} <StatusBadge status={i.status} /></span>}
        action={canEdit ? <ButtonLink variant="secondary" to={`/instruments/${i.id}/edit`}>Edit instrument</ButtonLink> : null}
      />
      {recordedCheck ? (
        <p role="status" className="mb-4 flex flex-wrap items-center gap-3 rounded-md border border-rule bg-card p-3 text-sm">
          Check recorded: {TYPE_LABELS[recordedCheck.type]} <OutcomeBadge outcome={recordedCheck.outcome} /> <span className="num">{result(recordedCheck.resultG)}</span>
          {i.status === "out_of_service" ? <strong>The instrument is now out of service. Do not use it.</strong> : null}
        </p>
      ) : null}
      {actionData && "released" in actionData ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">Released to service. The event and the review's conclusion are in the audit trail.</p> : null}
      {i.status === "out_of_service" ? (
        <section aria-labelledby="oos-heading" className="mb-6 rounded-md border-2 border-out bg-card p-4">
          <h2 id="oos-heading" className="font-semibold">Out of service: do not use this instrument</h2>
          {review ? (
            <p className="mt-1 text-sm text-ink-soft">
              Impact review open since {new Date(review.openedAt).toISOString().slice(0, 10)}:{" "}
              {review.lastPassingAt
                ? `${review.checksSince} check(s) and ${review.daysOfUse} day(s) of use since the last passing ${review.checkType} check on ${new Date(review.lastPassingAt).toISOString().slice(0, 10)}.`
                : `no earlier passing ${review.checkType} check is recorded, so every weighing since the instrument entered service is in question.`}{" "}
              Assess the weighings made in that period under your quality system.
            </p>
          ) : null}
          {canRelease ? (
            <Form method="post" className="mt-4 grid max-w-2xl gap-3 text-sm">
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
              {actionData?.errors?.length ? <p role="alert" className="text-out">{actionData.errors.join(" ")}</p> : null}
              <div><Button type="submit">Release to service</Button></div>
            </Form>
          ) : null}
        </section>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_1fr]">
        <section aria-labelledby="props-heading" className="rounded-md border border-rule bg-card p-4">
          <h2 id="props-heading" className="mb-3 font-semibold">Properties</h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            {properties.map(([term, value]) => (
              <div key={term} className="contents">
                <dt className="text-ink-soft">{term}</dt>
                <dd className="num">{value}</dd>
              </div>
            ))}
          </dl>
        </section>
        <div className="grid content-start gap-6">
          {canRecord && i.status === "in_service" ? (
            <div className="flex flex-wrap gap-2" aria-label="Record a check">
              {CHECK_TYPES.map((t) => <ButtonLink key={t} variant={t === "sensitivity" ? "primary" : "secondary"} to={`/instruments/${i.id}/record/${t}`}>Record {t} check</ButtonLink>)}
            </div>
          ) : null}
          <section aria-labelledby="checks-heading" className="rounded-md border border-rule bg-card p-4">
            <h2 id="checks-heading" className="mb-2 font-semibold">Latest checks</h2>
            {checks.length === 0 ? (
              <p className="text-sm text-ink-soft">No checks are recorded for this instrument yet.{canRecord ? " Record the first one with the buttons above." : ""}</p>
            ) : (
              <table className="w-full text-sm">
                <thead className="text-ink-soft">
                  <tr>
                    <th scope="col" className="py-1 text-left font-medium">When (UTC)</th>
                    <th scope="col" className="py-1 text-left font-medium">Check</th>
                    <th scope="col" className="py-1 text-right font-medium">Result</th>
                    <th scope="col" className="py-1 text-right font-medium">Tolerance</th>
                    <th scope="col" className="py-1 pl-4 text-left font-medium">Outcome</th>
                    <th scope="col" className="py-1 text-left font-medium">Operator</th>
                  </tr>
                </thead>
                <tbody>
                  {checks.map((c) => (
                    <tr key={c.id} className="border-t border-rule/60">
                      <td className="num py-1">{new Date(c.performedAt).toISOString().slice(0, 16).replace("T", " ")}</td>
                      <td className="py-1">{TYPE_LABELS[c.type]}</td>
                      <td className="num py-1 text-right">{result(c.resultG)}</td>
                      <td className="num py-1 text-right">{c.toleranceG === null ? "—" : `± ${result(c.toleranceG)}`}</td>
                      <td className="py-1 pl-4"><OutcomeBadge outcome={c.outcome} /></td>
                      <td className="py-1">{c.operator}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>
          <section aria-labelledby="charts-heading" className="rounded-md border border-rule bg-card p-4">
            <h2 id="charts-heading" className="font-semibold">Drift charts</h2>
            <p className="mt-2 text-sm text-ink-soft">Control charts appear once the instrument has enough checks to set a baseline (at least 8).</p>
          </section>
          <Caution>
            Tareline supports, and does not replace, calibration by an accredited provider, your site's quality system, the legal-metrology
            rules that apply to trade use, and the maker's instructions.
          </Caution>
          <p className="text-sm"><Link to="/instruments" className="text-accent underline">All instruments</Link></p>
        </div>
      </div>
    </>
  );
}
