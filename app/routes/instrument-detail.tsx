import { Link, useSearchParams } from "react-router";
import { ChecksTable } from "~/components/instruments/checks-table";
import { RangeControl } from "~/components/instruments/range-control";
import { ReleasePanel } from "~/components/instruments/release-panel";
import { SeriesPanel } from "~/components/instruments/series-panel";
import { ButtonLink } from "~/components/ui/button";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { PanelBoundary } from "~/components/ui/panel-boundary";
import { StatusBadge } from "~/components/ui/status-badge";
import { CheckTableParamsSchema } from "~/lib/check-table-params";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { handleInstrumentAction } from "~/lib/instrument-actions.server";
import { KIND_LABELS } from "~/lib/instrument-form";
import { can } from "~/lib/permissions";
import { parseSearchParams } from "~/lib/search-params";
import { rangeBounds, SeriesParamsSchema } from "~/lib/series-params";
import { formatMass, naturalUnit } from "~/lib/units";
import { listInstrumentChecks } from "~/queries/instrument-checks.server";
import { openImpactReview } from "~/queries/instrument-history.server";
import { getInstrumentPage } from "~/queries/instruments.server";
import { getInstrumentSeries } from "~/queries/series.server";
import { CHECK_TYPES } from "../../db/schema/enums";
import type { Route } from "./+types/instrument-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data?.instrument.assetTag ?? "Instrument"} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, Number(params.id));
  const view = parseSearchParams(SeriesParamsSchema, request.url);
  const table = parseSearchParams(CheckTableParamsSchema, request.url);
  const now = new Date();
  const bounds = rangeBounds(view, now);
  const [series, checks, review] = await Promise.all([
    Promise.all(CHECK_TYPES.map((type) => getInstrumentSeries(db(), instrument, type, bounds, now))),
    listInstrumentChecks(db(), instrument.id, table),
    openImpactReview(db(), instrument.id),
  ]);
  return {
    instrument,
    view,
    from: bounds.from?.toISOString() ?? null,
    now: now.toISOString(),
    series: series.filter((s) => s.points.length > 0 || s.requirement.basis !== null),
    checks,
    table,
    review,
    canEdit: can(viewer, "manage_instruments", instrument.siteId),
    canRecord: can(viewer, "record_check", instrument.siteId),
    canReview: can(viewer, "review_points", instrument.siteId),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, Number(params.id));
  return handleInstrumentAction(request, viewer, instrument);
}

const TYPE_LABELS = { sensitivity: "Sensitivity", repeatability: "Repeatability", eccentricity: "Eccentricity" } as const;

export default function InstrumentDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { instrument: i, view, series, checks, table, review, canEdit, canRecord, canReview } = loaderData;
  const [search] = useSearchParams();
  const recorded = Number(search.get("recorded")) || null;
  const recordedCheck = checks.rows.find((c) => c.id === recorded);
  const mass = (g: string | null) => (g ? formatMass(g, naturalUnit(g)) : "—");
  const now = new Date(loaderData.now);
  const from = loaderData.from ? new Date(loaderData.from) : null;
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
          Check recorded: {TYPE_LABELS[recordedCheck.type]} <OutcomeBadge outcome={recordedCheck.outcome} /> <span className="num">{formatMass(recordedCheck.resultG, i.displayUnit, i.readabilityG)}</span>
          {i.status === "out_of_service" ? <strong>The instrument is now out of service. Do not use it.</strong> : null}
        </p>
      ) : null}
      {actionData?.done ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">{actionData.done}</p> : null}
      {actionData?.errors?.length ? <p role="alert" className="mb-4 rounded-md border border-out bg-card p-3 text-sm text-out">{actionData.errors.join(" ")}</p> : null}
      {i.status === "out_of_service" ? <ReleasePanel review={review} canRelease={canReview} errors={[]} /> : null}
      <div className="grid gap-6 xl:grid-cols-[20rem_minmax(0,1fr)]">
        <aside className="grid content-start gap-4">
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
          <nav aria-label="Check programme" className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
            <Link to={`/instruments/${i.id}/plans`} className="text-accent underline">Check plans</Link>
            <Link to={`/print/instruments/${i.id}`} className="text-accent underline">Print history</Link>
          </nav>
          {canRecord && i.status === "in_service" ? (
            <div className="grid gap-2" aria-label="Record a check">
              {CHECK_TYPES.map((t) => <ButtonLink key={t} variant={t === "sensitivity" ? "primary" : "secondary"} to={`/instruments/${i.id}/record/${t}`}>Record {t} check</ButtonLink>)}
            </div>
          ) : null}
          <Caution>
            Tareline supports, and does not replace, calibration by an accredited provider, your site's quality system, the legal-metrology rules that apply to trade use, and the maker's instructions.
          </Caution>
        </aside>
        <div className="grid min-w-0 content-start gap-6">
          <section aria-labelledby="drift-heading" className="grid min-w-0 gap-4">
            <div className="flex flex-wrap items-end justify-between gap-3">
              <h2 id="drift-heading" className="text-lg font-semibold">Drift study</h2>
              <RangeControl params={view} />
            </div>
            {series.length === 0 ? <p className="rounded-md border border-dashed border-rule bg-card p-6 text-sm text-ink-soft">No checks yet. Charts appear once checks are recorded; limits need at least 8 checks after the latest reset.</p> : null}
            {series.map((s) => (
              <section key={s.type} aria-label={`${TYPE_LABELS[s.type]} panel`} className="grid min-w-0 gap-3">
                <h3 className="text-base font-semibold">{TYPE_LABELS[s.type]}</h3>
                <PanelBoundary title={`${TYPE_LABELS[s.type]} charts`}>
                  <SeriesPanel instrumentId={i.id} params={{ ...view, type: s.type }} initial={s} from={from} now={now} />
                </PanelBoundary>
              </section>
            ))}
          </section>
          <ChecksTable page={checks} params={table} unit={i.displayUnit} readabilityG={i.readabilityG} timeZone={i.siteTimeZone} canReview={canReview} />
        </div>
      </div>
    </>
  );
}
