import { data, Form, useSearchParams } from "react-router";
import { z } from "zod";
import { Button } from "~/components/ui/button";
import { Field, inputClass } from "~/components/ui/field";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { listTrainingBySite, mayTrain, recordTraining, type TrainingState } from "~/queries/training.server";
import { CHECK_TYPES } from "../../db/schema/enums";
import type { Route } from "./+types/training";

export const meta = () => [{ title: "Training · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  return { sites: await listTrainingBySite(db(), viewer, new Date()), canManage: can(viewer, "manage_training"), selfOnly: !can(viewer, "view_training") };
}

const date = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Give a date.");
const TrainingSchema = z
  .object({
    userId: z.coerce.number({ error: "Choose the person." }).int().positive("Choose the person."),
    procedure: z.string().trim().min(3, "Name the check procedure.").max(80),
    trainedOn: date,
    trainerName: z.string().trim().min(2, "Name the trainer.").max(120),
    expiresOn: z.preprocess((v) => (v === "" ? null : v), date.nullable()),
    evidence: z.string().trim().max(1000).default(""),
  })
  .refine((f) => f.expiresOn === null || f.expiresOn > f.trainedOn, { path: ["expiresOn"], message: "The expiry date must come after the training date." });

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  if (!can(viewer, "manage_training")) throw forbiddenPage("Only a metrologist or an administrator records training.");
  const form = Object.fromEntries(await request.formData());
  const procedure = form.procedure === "custom" ? form.customProcedure : form.procedure;
  const parsed = TrainingSchema.safeParse({ ...form, procedure });
  if (!parsed.success) return data({ errors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])) }, { status: 400 });
  if (!(await mayTrain(db(), viewer, parsed.data.userId))) throw forbiddenPage("That person has no role at a site where you manage training.");
  await recordTraining(db(), viewer, parsed.data);
  return { errors: {} as Record<string, string>, saved: true };
}

const STATE_WORDS: Record<TrainingState, string> = { expired: "Expired", expiring: "Expires soon", current: "Current" };

function StateLabel({ state, daysLeft }: { state: TrainingState; daysLeft: number | null }) {
  return (
    <span className={`inline-flex items-center gap-1.5 ${state === "expired" ? "font-medium text-out" : state === "expiring" ? "text-guard" : "text-ink-soft"}`}>
      <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true">
        {state === "expired" ? <path d="M2.5 2.5l7 7M9.5 2.5l-7 7" className="stroke-out" strokeWidth="2" /> : state === "expiring" ? <path d="M6 1.5 11 10.5H1Z" className="fill-none stroke-guard" strokeWidth="1.5" /> : <circle cx="6" cy="6" r="4" className="fill-none stroke-ink-soft" strokeWidth="1.5" />}
      </svg>
      {STATE_WORDS[state]}{daysLeft !== null && state !== "current" ? <span className="num">({state === "expired" ? `${-daysLeft} d ago` : `in ${daysLeft} d`})</span> : null}
    </span>
  );
}

export default function Training({ loaderData, actionData }: Route.ComponentProps) {
  const { sites, canManage, selfOnly } = loaderData;
  const [search] = useSearchParams();
  const errors: Record<string, string> = actionData?.errors ?? {};
  const people = [...new Map(sites.filter((s) => s.canManage).flatMap((s) => s.people).map((p) => [p.userId, p])).values()];
  return (
    <>
      <PageHeader title="Training" subtitle={selfOnly ? "Your training records. Only a trained person with an unexpired record can record a check of that procedure." : "Who may perform which check procedure. Only a trained person with an unexpired record can record that check."} />
      {actionData && "saved" in actionData ? <p role="status" className="mb-4 rounded-md border border-rule bg-card p-3 text-sm">Training recorded. It is in the audit trail.</p> : null}
      {sites.map((s) => {
        const attention = s.rows.filter((r) => r.state !== "current");
        return (
          <section key={s.id} aria-labelledby={`training-${s.id}`} className="mb-8">
            <h2 id={`training-${s.id}`} className="mb-2 font-semibold">{s.code} · {s.name} · today {s.today}</h2>
            {attention.length ? (
              <div className="mb-3 max-w-4xl rounded-md border border-guard/60 bg-card p-3 text-sm" aria-label={`Expired or expiring at ${s.code}`}>
                <p className="font-medium">Expired or expiring within 30 days</p>
                <ul className="mt-1">{attention.map((r) => <li key={r.id}>{r.person} · {r.procedure} · expires {r.expiresOn} · <StateLabel state={r.state} daysLeft={r.daysLeft} /></li>)}</ul>
              </div>
            ) : null}
            <table className="w-full max-w-5xl rounded-md border border-rule bg-card text-sm">
              <thead className="border-b border-rule text-ink-soft">
                <tr>{["Person", "Procedure", "Trained on", "Trainer", "Expires on", "State", "Evidence"].map((h) => <th key={h} scope="col" className="px-3 py-2 text-left font-medium">{h}</th>)}</tr>
              </thead>
              <tbody>
                {s.rows.length === 0 ? <tr><td colSpan={7} className="px-3 py-4 text-center text-ink-soft">No training recorded for the people at this site.</td></tr> : null}
                {s.rows.map((r) => (
                  <tr key={r.id} className="border-b border-rule/60 last:border-0">
                    <td className="whitespace-nowrap px-3 py-2">{r.person}</td>
                    <td className="px-3 py-2">{r.procedure}</td>
                    <td className="num whitespace-nowrap px-3 py-2">{r.trainedOn}</td>
                    <td className="whitespace-nowrap px-3 py-2">{r.trainerName}</td>
                    <td className="num whitespace-nowrap px-3 py-2">{r.expiresOn ?? "No expiry"}</td>
                    <td className="whitespace-nowrap px-3 py-2"><StateLabel state={r.state} daysLeft={r.daysLeft} /></td>
                    <td className="px-3 py-2 text-ink-soft">{r.evidence}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        );
      })}
      {canManage && people.length ? (
        <section aria-labelledby="record-training" className="mt-8 max-w-3xl">
          <h2 id="record-training" className="mb-3 text-lg font-semibold">Record training</h2>
          <Form method="post" className="grid gap-4 rounded-md border border-rule bg-card p-4 sm:grid-cols-2" key={search.toString() + String(actionData && "saved" in actionData)}>
            <Field id="t-user" label="Person" errors={errors.userId ? [errors.userId] : undefined}>
              <select id="t-user" name="userId" className={inputClass}><option value="">Choose…</option>{people.map((p) => <option key={p.userId} value={p.userId}>{p.name}</option>)}</select>
            </Field>
            <Field id="t-procedure" label="Check procedure" errors={errors.procedure ? [errors.procedure] : undefined}>
              <select id="t-procedure" name="procedure" className={inputClass}>{CHECK_TYPES.map((t) => <option key={t} value={t}>{t}</option>)}<option value="custom">Another procedure (name it)…</option></select>
            </Field>
            <Field id="t-custom" label="Other procedure's name" hint="Only when the procedure is not one of the three checks."><input id="t-custom" name="customProcedure" className={inputClass} /></Field>
            <Field id="t-trainer" label="Trainer" errors={errors.trainerName ? [errors.trainerName] : undefined}><input id="t-trainer" name="trainerName" className={inputClass} /></Field>
            <Field id="t-on" label="Trained on" errors={errors.trainedOn ? [errors.trainedOn] : undefined}><input id="t-on" name="trainedOn" type="date" className={inputClass} /></Field>
            <Field id="t-expires" label="Expires on" hint="Leave empty only if your quality system sets no expiry." errors={errors.expiresOn ? [errors.expiresOn] : undefined}><input id="t-expires" name="expiresOn" type="date" className={inputClass} /></Field>
            <div className="sm:col-span-2"><Field id="t-evidence" label="Evidence" hint="e.g. practical assessment passed, record reference."><textarea id="t-evidence" name="evidence" rows={2} className={inputClass} /></Field></div>
            <div><Button type="submit">Record training</Button></div>
          </Form>
        </section>
      ) : null}
    </>
  );
}
