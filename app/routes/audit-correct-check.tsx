import { data, Form, Link, redirect } from "react-router";
import { ListReadings, PanReadings } from "~/components/checks/reading-inputs";
import { Button } from "~/components/ui/button";
import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { PageHeader } from "~/components/ui/page-header";
import { ECCENTRICITY_POSITIONS } from "~/lib/check-readings";
import { db } from "~/lib/db.server";
import { CheckRefused } from "~/lib/domain-errors";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { sendMail } from "~/lib/mail.server";
import { formatMass } from "~/lib/units";
import { correctCheck, getCheckForCorrection } from "~/queries/audit-trail-corrections.server";
import { deliverNotifications } from "~/queries/consequences.server";
import type { Route } from "./+types/audit-correct-check";

export const meta = () => [{ title: "Correct a check · Tareline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const page = await getCheckForCorrection(db(), viewer, Number(params.id));
  if (!page.mayCorrect) throw forbiddenPage("Only the person who performed the check or a metrologist may correct it.");
  return page;
}

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const { check } = await getCheckForCorrection(db(), viewer, Number(params.id));
  const form = await request.formData();
  const readings = check.checkType === "eccentricity" ? Object.fromEntries(ECCENTRICITY_POSITIONS.map((p) => [p, String(form.get(p) ?? "")])) : form.getAll("readings").map(String);
  try {
    const corrected = await correctCheck(db(), viewer, { checkId: check.id, readings, reason: String(form.get("reason") ?? "") });
    await deliverNotifications(db(), corrected.notificationIds, sendMail);
    return redirect(`/print/checks/${corrected.id}`);
  } catch (error) {
    if (error instanceof CheckRefused) return data({ problems: error.problems }, { status: error.status === 403 ? 403 : error.status === 409 ? 409 : 400 });
    throw error;
  }
}

export default function CorrectCheck({ loaderData, actionData }: Route.ComponentProps) {
  const { check, instrument, readings } = loaderData;
  const errors = Object.fromEntries((actionData?.problems ?? []).map((p) => [p.pointer, p.message]));
  return (
    <>
      <PageHeader title={`Correct check ${check.id} · ${instrument.assetTag}`} subtitle="The original stays on record, marked as corrected, with your reason. The corrected readings are judged again by the engine." />
      <p className="mb-4 text-sm"><Link to={`/print/checks/${check.id}`} className="text-accent underline">The check record</Link></p>
      <section className="mb-6 max-w-3xl rounded-md border border-rule bg-card p-4 text-sm">
        <h2 className="font-semibold">As recorded</h2>
        <p className="mt-1 flex flex-wrap items-center gap-3">{check.checkType} · {new Date(check.performedAt).toISOString().slice(0, 16).replace("T", " ")} UTC · <span className="num">{formatMass(check.resultG, check.unit, instrument.readabilityG)}</span> <OutcomeBadge outcome={check.outcome} /></p>
        <p className="num mt-1 text-ink-soft">Readings ({check.unit}): {readings.map((r) => (r.position ? `${r.position} ${r.value}` : r.value)).join(" · ")}</p>
      </section>
      {check.supersededAt ? <p role="alert" className="max-w-3xl rounded-md border border-out bg-card p-4 text-out">This check was already corrected.</p> : (
        <Form method="post" className="grid max-w-4xl gap-4">
          {actionData?.problems?.length ? <div role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{actionData.problems.map((p) => <p key={p.message}>{p.message}</p>)}</div> : null}
          <fieldset className="rounded-md border border-rule bg-card p-4">
            <legend className="px-1 text-sm font-semibold">Corrected readings ({check.unit})</legend>
            {check.checkType === "eccentricity" ? <PanReadings unit={check.unit} onInput={() => {}} errors={errors} /> : <ListReadings count={check.checkType === "repeatability" ? Math.max(10, readings.length) : Math.max(3, readings.length)} unit={check.unit} onInput={() => {}} errors={errors} />}
          </fieldset>
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-medium">Reason for the correction</span>
            <textarea name="reason" required rows={2} className="rounded-md border border-rule bg-card px-3 py-2" aria-invalid={errors["/reason"] ? true : undefined} />
          </label>
          <div><Button type="submit">Record the correction</Button></div>
        </Form>
      )}
    </>
  );
}
