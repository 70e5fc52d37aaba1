import { parseWithZod } from "@conform-to/zod/v4";
import { data, Link, redirect, useSearchParams } from "react-router";
import { CHECK_TYPE_LABELS } from "~/components/plans/due-badge";
import { WeightForm } from "~/components/weights/weight-form";
import { WeightFormSchema } from "~/components/weights/weight-form-schema";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { localDate } from "~/lib/schedule";
import { certificateFrom, readUploadForm } from "~/lib/storage-upload.server";
import { formatMass, fromGrams, naturalUnit } from "~/lib/units";
import { listSitesAndRooms } from "~/queries/instruments.server";
import { DuplicateWeightError, getWeight, plansUsingWeight, saveWeight } from "~/queries/weights.server";
import type { Route } from "./+types/weights-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data?.weight.identifier ?? "Test weight"} · Tareline` }];

const HEAVY_G = 20_000;

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const { weight, siteCode, siteName, timeZone } = await getWeight(db(), viewer, Number(params.id));
  const today = localDate(new Date(), timeZone);
  const canManage = can(viewer, "manage_instruments", weight.siteId);
  const sites = canManage ? (await listSitesAndRooms(db(), viewer)).sites.filter((s) => can(viewer, "manage_instruments", s.id)).map((s) => ({ id: s.id, code: s.code, name: s.name })) : [];
  return { weight, siteCode, siteName, today, expired: weight.dueOn < today, plans: await plansUsingWeight(db(), weight, today), canManage, sites };
}

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const { weight } = await getWeight(db(), viewer, Number(params.id));
  if (!can(viewer, "manage_instruments", weight.siteId)) throw forbiddenPage("Only a metrologist or an administrator edits the weight register.");
  const form = await readUploadForm(request);
  const submission = parseWithZod(form, { schema: WeightFormSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), certificateError: null }, { status: 400 });
  if (!can(viewer, "manage_instruments", submission.value.siteId)) throw forbiddenPage();
  const certificate = await certificateFrom(form);
  if (certificate.problem) return data({ result: submission.reply(), certificateError: certificate.problem }, { status: 400 });
  try {
    await saveWeight(db(), viewer, { id: weight.id, form: submission.value, certificate: certificate.upload });
    return redirect(`/weights/${weight.id}?saved=1`);
  } catch (error) {
    if (error instanceof DuplicateWeightError) return data({ result: submission.reply({ fieldErrors: { identifier: [error.message] } }), certificateError: null }, { status: 400 });
    throw error;
  }
}

export default function WeightDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { weight: w, siteCode, siteName, expired, plans, canManage, sites } = loaderData;
  const [search] = useSearchParams();
  const unfit = plans.filter((p) => !p.verdict.suitable);
  const unit = naturalUnit(w.nominalG);
  const facts: [string, string][] = [
    ["Nominal value", formatMass(w.nominalG, unit)],
    ["Class", w.weightClass],
    ["Conventional mass", `${w.conventionalMassG} g`],
    ["Expanded uncertainty U (k = 2)", formatMass(w.expandedUncertaintyG, "mg")],
    ["Certificate", w.certificateNumber],
    ["Calibrated on", w.calibratedOn],
    ["Due for recalibration", w.dueOn],
    ["Custodian site", `${siteCode} · ${siteName}`],
    ["Set", w.setLabel ?? "—"],
  ];
  return (
    <>
      <PageHeader title={`Test weight ${w.identifier}`} subtitle={`${formatMass(w.nominalG, unit)} · class ${w.weightClass} · used by ${plans.length} plan${plans.length === 1 ? "" : "s"}`} action={<Link to="/weights" className="text-sm text-accent underline">All test weights</Link>} />
      {search.get("saved") ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">Saved. The change is in the audit trail with its before and after.</p> : null}
      {expired ? (
        <section role="alert" aria-labelledby="expired-heading" className="mb-6 rounded-md border-2 border-out bg-card p-4 text-sm">
          <h2 id="expired-heading" className="font-semibold">Certificate expired on {w.dueOn}: this weight cannot be chosen for a check</h2>
          {plans.length ? (
            <ul className="mt-2 list-disc pl-5">
              {plans.map((p) => <li key={p.planId}><Link to={`/plans/${p.planId}`} className="text-accent-deep underline">{p.assetTag} · {CHECK_TYPE_LABELS[p.checkType]}</Link>{p.alternatives.length ? ` can use ${p.alternatives.join(", ")} instead.` : " has no other usable weight assigned."}</li>)}
            </ul>
          ) : <p className="mt-1">No plan depends on it.</p>}
        </section>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_1fr]">
        <section aria-labelledby="facts-heading" className="rounded-md border border-rule bg-card p-4">
          <h2 id="facts-heading" className="mb-3 font-semibold">Certificate</h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
            {facts.map(([term, value]) => <div key={term} className="contents"><dt className="text-ink-soft">{term}</dt><dd className="num">{value}</dd></div>)}
          </dl>
          <p className="mt-3 text-sm">{w.certificateFile ? <a href={`/weights/${w.id}/certificate`} className="text-accent underline">Open the certificate file ({w.certificateFileName})</a> : "No certificate file uploaded."}</p>
        </section>
        <section aria-labelledby="plans-heading" className="rounded-md border border-rule bg-card p-4">
          <h2 id="plans-heading" className="mb-1 font-semibold">Suitability for the plans that use it</h2>
          <p className="mb-3 text-sm text-ink-soft">Class mpe (OIML R 111 Table 1) and certificate U must each be at most T/3 at the weight's load (USP &lt;41&gt;).{unfit.length ? ` It may not serve ${unfit.length} of them.` : ""}</p>
          {plans.length === 0 ? <p className="text-sm text-ink-soft">No plan uses this weight.</p> : (
            <ul className="grid gap-3 text-sm">
              {plans.map((p) => (
                <li key={p.planId} className="border-t border-rule/60 pt-2">
                  <Link to={`/plans/${p.planId}`} className="font-medium text-accent-deep underline">{p.assetTag} · {CHECK_TYPE_LABELS[p.checkType]}</Link>{" "}
                  {p.verdict.suitable ? <span>— may serve{p.verdict.limitG !== null ? ` (T/3 = ${Number((p.verdict.limitG * 1000).toPrecision(3))} mg)` : ""}.</span> : <strong className="text-out">— may not serve:</strong>}
                  {p.verdict.problems.map((x) => <p key={x} className="text-out">{x}</p>)}
                  {p.verdict.notes.map((x) => <p key={x} className="text-ink-soft">{x}</p>)}
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
      {Number(w.nominalG) > HEAVY_G ? <div className="mt-6"><Caution>This weight is over 20 kg: use lifting aids and two people, and follow your site's manual-handling rules.</Caution></div> : null}
      {canManage ? (
        <section aria-labelledby="edit-heading" className="mt-8">
          <h2 id="edit-heading" className="mb-3 text-lg font-semibold">Update from a new certificate</h2>
          <WeightForm
            lastResult={actionData?.result}
            certificateError={actionData?.certificateError}
            sites={sites}
            submitLabel="Save weight"
            defaultValue={{ identifier: w.identifier, setLabel: w.setLabel ?? "", siteId: String(w.siteId), unit: "g", nominal: w.nominalG, conventionalMass: w.conventionalMassG, uncertaintyMg: fromGrams(w.expandedUncertaintyG, "mg"), weightClass: w.weightClass, certificateNumber: w.certificateNumber, calibratedOn: w.calibratedOn, dueOn: w.dueOn }}
          />
        </section>
      ) : null}
    </>
  );
}
