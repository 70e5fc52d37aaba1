import { useRef, useState } from "react";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import { CheckPreview } from "~/components/checks/check-preview";
import { ListReadings, PanReadings } from "~/components/checks/reading-inputs";
import { Button } from "~/components/ui/button";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { ECCENTRICITY_POSITIONS } from "~/lib/check-readings";
import { db } from "~/lib/db.server";
import { CheckRefused } from "~/lib/domain-errors";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage, notFoundPage } from "~/lib/http.server";
import { sendMail } from "~/lib/mail.server";
import { can } from "~/lib/permissions";
import { formatMass } from "~/lib/units";
import { recordCheck } from "~/queries/checks.server";
import { deliverNotifications } from "~/queries/consequences.server";
import { getInstrumentPage } from "~/queries/instruments.server";
import { loadRecordCheckPage } from "~/queries/record-check-page.server";
import { instruments } from "../../db/schema";
import { CHECK_TYPES, MASS_UNITS, type CheckType, type MassUnit } from "../../db/schema/enums";
import { eq } from "drizzle-orm";
import type { Route } from "./+types/record-check";

const TYPE_TITLES: Record<CheckType, string> = { sensitivity: "Sensitivity check", repeatability: "Repeatability check", eccentricity: "Eccentricity check" };

async function context(request: Request, params: { id?: string; type?: string }) {
  const type = CHECK_TYPES.find((t) => t === params.type);
  if (!type) throw notFoundPage("There is no such check type.");
  const viewer = await requireViewer(request);
  const visible = await getInstrumentPage(db(), viewer, Number(params.id));
  if (!can(viewer, "record_check", visible.siteId)) throw forbiddenPage("Your role at this site does not record checks.");
  return { viewer, type, visible };
}

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data ? TYPE_TITLES[data.type] : "Record a check"} · Tareline` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { viewer, type, visible } = await context(request, params);
  const [instrument] = await db().select().from(instruments).where(eq(instruments.id, visible.id));
  const today = new Date().toISOString().slice(0, 10);
  const page = await loadRecordCheckPage(db(), { instrument, type, userId: viewer.id, today });
  return { type, today, instrument: visible, ...page };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { viewer, type, visible } = await context(request, params);
  const form = await request.formData();
  const unit = MASS_UNITS.find((u) => u === form.get("unit")) ?? visible.displayUnit;
  const readings = type === "eccentricity" ? Object.fromEntries(ECCENTRICITY_POSITIONS.map((p) => [p, String(form.get(p) ?? "")])) : form.getAll("readings").map(String);
  try {
    const recorded = await recordCheck(db(), viewer, {
      instrument: { id: visible.id },
      type,
      performedAt: new Date(),
      unit,
      weight: type === "repeatability" ? null : String(form.get("weight") ?? "") || null,
      readings,
      note: String(form.get("note") ?? ""),
      source: "form",
    });
    await deliverNotifications(db(), recorded.notificationIds, sendMail);
    return redirect(`/instruments/${visible.id}?recorded=${recorded.id}`);
  } catch (error) {
    if (error instanceof CheckRefused) return data({ problems: error.problems }, { status: error.status === 404 ? 404 : error.status === 403 ? 403 : 400 });
    throw error;
  }
}

export default function RecordCheck({ loaderData, actionData }: Route.ComponentProps) {
  const { type, instrument, weights, suggestedWeight, requirement, trained, today, instrumentSpec } = loaderData;
  const formRef = useRef<HTMLFormElement>(null);
  const [values, setValues] = useState<{ readings: unknown; weight: string | null; unit: MassUnit }>({ readings: type === "eccentricity" ? {} : [], weight: suggestedWeight, unit: instrument.displayUnit });
  const navigation = useNavigation();
  const errors = Object.fromEntries((actionData?.problems ?? []).map((p) => [p.pointer, p.message]));
  const general = (actionData?.problems ?? []).filter((p) => !p.pointer.startsWith("/readings/"));
  const weight = weights.find((w) => w.identifier === values.weight) ?? null;

  const readForm = () => {
    const form = formRef.current;
    if (!form) return;
    const fd = new FormData(form);
    const readings = type === "eccentricity" ? Object.fromEntries(ECCENTRICITY_POSITIONS.map((p) => [p, String(fd.get(p) ?? "")])) : fd.getAll("readings").map(String);
    setValues({ readings, weight: String(fd.get("weight") ?? "") || null, unit: (MASS_UNITS.find((u) => u === fd.get("unit")) ?? instrument.displayUnit) as MassUnit });
  };

  const blocked = !trained ? `You have no valid training record for the ${type} check procedure. Ask your metrologist to record your training first.` : instrument.status !== "in_service" ? `${instrument.assetTag} is ${instrument.status === "retired" ? "retired" : "out of service until a metrologist releases it"}.` : !requirement ? `${instrument.assetTag} has no ${type} check plan yet; a metrologist must set its requirement first.` : null;

  return (
    <>
      <PageHeader title={`${TYPE_TITLES[type]} · ${instrument.assetTag}`} subtitle={`Readability d = ${formatMass(instrument.readabilityG, instrument.displayUnit)}. Type each reading as the display shows it.`} />
      <p className="mb-4 text-sm"><Link to={`/instruments/${instrument.id}`} className="text-accent underline">Back to {instrument.assetTag}</Link></p>
      {blocked ? (
        <p role="alert" className="max-w-2xl rounded-md border border-out bg-card p-4 text-out">{blocked}</p>
      ) : (
        <Form method="post" ref={formRef} onChange={readForm} className="grid max-w-4xl gap-6">
          {general.length ? <div role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{general.map((p) => <p key={p.message}>{p.message}</p>)}</div> : null}
          <div className="flex flex-wrap gap-4">
            {type !== "repeatability" ? (
              <label className="flex flex-col gap-1 text-sm">
                <span className="font-medium">Test weight</span>
                <select name="weight" defaultValue={suggestedWeight ?? ""} className="rounded-md border border-rule bg-card px-3 py-2">
                  {weights.map((w) => (
                    <option key={w.identifier} value={w.identifier} disabled={w.problems.length > 0}>
                      {w.identifier} · {formatMass(w.conventionalMassG, w.nominalG >= 1000 ? "kg" : "g")} · {w.weightClass} · due {w.dueOn}{w.problems.length ? " (not usable)" : ""}
                    </option>
                  ))}
                </select>
              </label>
            ) : null}
            <label className="flex flex-col gap-1 text-sm">
              <span className="font-medium">Unit of the readings</span>
              <select name="unit" defaultValue={instrument.displayUnit} className="rounded-md border border-rule bg-card px-3 py-2">
                {MASS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
              </select>
            </label>
          </div>
          {weight ? (
            <p className="text-sm text-ink-soft">
              Conventional mass {formatMass(weight.conventionalMassG, "g")}, class {weight.weightClass}, certificate {weight.certificateNumber} due {weight.dueOn}.
            </p>
          ) : null}
          {weights.some((w) => w.problems.length) ? (
            <details className="text-sm text-ink-soft">
              <summary>Why some weights cannot be chosen</summary>
              <ul className="mt-2 list-disc pl-5">{weights.filter((w) => w.problems.length).map((w) => <li key={w.identifier}>{w.problems.join(" ")}</li>)}</ul>
            </details>
          ) : null}
          {weight?.heavy ? <Caution>This test weight is over 20 kg. Use lifting aids, work with two people and follow your site's manual-handling rules.</Caution> : null}
          <fieldset className="rounded-md border border-rule bg-card p-4">
            <legend className="px-1 text-sm font-semibold">Readings</legend>
            {type === "eccentricity" ? <PanReadings unit={values.unit} onInput={readForm} errors={errors} /> : <ListReadings count={type === "repeatability" ? 10 : 3} unit={values.unit} onInput={readForm} errors={errors} />}
            <p className="mt-2 text-xs text-ink-faint">
              {type === "sensitivity" ? "One reading is enough; several are averaged." : type === "repeatability" ? "Weigh the same load 10 times (at least 6); empty boxes are ignored." : "Load at the centre first, then move it to each corner."}
            </p>
          </fieldset>
          <label className="flex flex-col gap-1 text-sm">
            <span className="font-medium">Note (optional)</span>
            <textarea name="note" rows={2} className="rounded-md border border-rule bg-card px-3 py-2" />
          </label>
          <section aria-labelledby="preview-heading" className="rounded-md border border-rule bg-card p-4">
            <h2 id="preview-heading" className="mb-2 font-semibold">Result as typed</h2>
            {requirement ? <CheckPreview type={type} unit={values.unit} readabilityG={instrument.readabilityG} instrument={instrumentSpec} requirement={requirement} weight={weight} readings={values.readings} today={today} /> : null}
          </section>
          <div>
            <Button type="submit" disabled={navigation.state === "submitting"}>Record check</Button>
          </div>
        </Form>
      )}
    </>
  );
}
