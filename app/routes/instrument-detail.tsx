import { ButtonLink } from "~/components/ui/button";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { StatusBadge } from "~/components/ui/status-badge";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { KIND_LABELS } from "~/lib/instrument-form";
import { can } from "~/lib/permissions";
import { formatMass, naturalUnit } from "~/lib/units";
import { getInstrumentPage } from "~/queries/instruments.server";
import type { Route } from "./+types/instrument-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data?.instrument.assetTag ?? "Instrument"} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, Number(params.id));
  return { instrument, canEdit: can(viewer, "manage_instruments", instrument.siteId) };
}

export default function InstrumentDetail({ loaderData }: Route.ComponentProps) {
  const { instrument: i, canEdit } = loaderData;
  const mass = (g: string | null) => (g ? formatMass(g, naturalUnit(g)) : "—");
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
        <div className="grid gap-6">
          <section aria-labelledby="checks-heading" className="rounded-md border border-rule bg-card p-4">
            <h2 id="checks-heading" className="font-semibold">Checks</h2>
            <p className="mt-2 text-sm text-ink-soft">No checks are recorded for this instrument yet. Recorded checks and their outcomes will be listed here.</p>
          </section>
          <section aria-labelledby="charts-heading" className="rounded-md border border-rule bg-card p-4">
            <h2 id="charts-heading" className="font-semibold">Drift charts</h2>
            <p className="mt-2 text-sm text-ink-soft">Control charts appear once the instrument has enough checks to set a baseline (at least 8).</p>
          </section>
          <Caution>
            Tareline supports, and does not replace, calibration by an accredited provider, your site's quality system, the legal-metrology
            rules that apply to trade use, and the maker's instructions.
          </Caution>
        </div>
      </div>
    </>
  );
}
