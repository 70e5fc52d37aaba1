import { getFormProps, getInputProps, getSelectProps, getTextareaProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { Button } from "~/components/ui/button";
import { Field, inputClass } from "~/components/ui/field";
import { assessRisk, CONSEQUENCE_LABELS, CONSEQUENCES, type Consequence } from "~/lib/risk";
import type { AccuracyClass } from "~/lib/stats/oiml-r76";
import { formatMass, naturalUnit } from "~/lib/units";
import { CHECK_TYPES, type CheckType } from "../../../db/schema/enums";
import { CHECK_TYPE_LABELS } from "./due-badge";
import { GUARD_BAND_LABELS, GUARD_BAND_POLICIES, PlanFormSchema, TOLERANCE_BASES, TOLERANCE_BASIS_LABELS } from "./plan-form-schema";
import { RiskPanel } from "./risk-panel";

export interface PlanFormWeight {
  id: number;
  identifier: string;
  nominalG: string;
  weightClass: string;
  expandedUncertaintyG: string;
  dueOn: string;
  expired: boolean;
}

interface Props {
  lastResult?: SubmissionResult<string[]> | null;
  defaultValue: Record<string, string | string[] | undefined>;
  fixedType: CheckType | null;
  takenTypes: CheckType[];
  instrument: { readabilityG: string; verificationIntervalG: string; accuracyClass: AccuracyClass | null; capacityG: string };
  measuredMinimumWeightG: number | null;
  weights: PlanFormWeight[];
  submitLabel: string;
}

const str = (v: unknown) => (typeof v === "string" ? v : undefined);
const num = (v: unknown) => (typeof v === "string" && v !== "" && Number.isFinite(Number(v)) && Number(v) > 0 ? Number(v) : null);

export function PlanForm({ lastResult, defaultValue, fixedType, takenTypes, instrument, measuredMinimumWeightG, weights, submitLabel }: Props) {
  const [form, fields] = useForm({ lastResult, defaultValue, shouldValidate: "onBlur", shouldRevalidate: "onInput", onValidate: ({ formData }) => parseWithZod(formData, { schema: PlanFormSchema }) });
  const type = (fixedType ?? str(fields.checkType.value) ?? "sensitivity") as CheckType;
  const consequence = (CONSEQUENCES as readonly string[]).includes(str(fields.consequence.value) ?? "") ? (fields.consequence.value as Consequence) : null;
  const risk = consequence
    ? assessRisk({
        consequence,
        smallestNetWeightG: num(fields.smallestNetWeightG.value),
        processTolerancePercent: num(fields.processTolerancePercent.value),
        readabilityG: Number(instrument.readabilityG),
        verificationIntervalG: Number(instrument.verificationIntervalG),
        accuracyClass: instrument.accuracyClass,
        measuredMinimumWeightG,
        safetyFactor: num(fields.safetyFactor.value) ?? 2,
      })
    : null;
  const suggested = risk?.suggestedIntervals[type];
  const basis = str(fields.toleranceBasis.value);
  const selected = new Set((Array.isArray(defaultValue.weightIds) ? defaultValue.weightIds : []).map(String));
  return (
    <Form method="post" {...getFormProps(form)} className="grid max-w-4xl gap-6">
      {form.errors?.length ? <p role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{form.errors.join(" ")}</p> : null}
      {fixedType ? <input type="hidden" name="checkType" value={fixedType} /> : (
        <Field id={fields.checkType.id} label="Check type" errors={fields.checkType.errors}>
          <select {...getSelectProps(fields.checkType)} className={`${inputClass} max-w-xs`}>
            {CHECK_TYPES.map((t) => <option key={t} value={t} disabled={takenTypes.includes(t)}>{CHECK_TYPE_LABELS[t]}{takenTypes.includes(t) ? " (has a plan)" : ""}</option>)}
          </select>
        </Field>
      )}
      <fieldset className="grid gap-4 rounded-md border border-rule p-4 sm:grid-cols-3">
        <legend className="px-1 text-sm font-semibold">Risk assessment</legend>
        <Field id={fields.consequence.id} label="A wrong result would affect" errors={fields.consequence.errors}>
          <select {...getSelectProps(fields.consequence)} className={inputClass}>
            <option value="">Choose…</option>
            {CONSEQUENCES.map((c) => <option key={c} value={c}>{CONSEQUENCE_LABELS[c]}</option>)}
          </select>
        </Field>
        <Field id={fields.smallestNetWeightG.id} label="Smallest net weight weighed (g)" hint="Saved on the instrument, shared by its plans." errors={fields.smallestNetWeightG.errors}>
          <input {...getInputProps(fields.smallestNetWeightG, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.processTolerancePercent.id} label="Process tolerance (%)" hint="How close the process needs the weighed quantity." errors={fields.processTolerancePercent.errors}>
          <input {...getInputProps(fields.processTolerancePercent, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <div className="sm:col-span-3">
          {risk ? (
            <RiskPanel risk={risk}>
              {suggested ? (
                <Button type="button" variant="secondary" className="mt-3" onClick={() => form.update({ name: fields.intervalDays.name, value: String(suggested) })}>
                  Use the suggested interval ({suggested === 1 ? "every day" : `${suggested} days`})
                </Button>
              ) : <p className="mt-3 text-ink-soft">This risk level does not call for a {type} check; you may still plan one.</p>}
            </RiskPanel>
          ) : <p className="text-sm text-ink-soft">Choose what a wrong result would affect to see the suggested interval and check types.</p>}
        </div>
      </fieldset>
      <fieldset className="grid gap-4 rounded-md border border-rule p-4 sm:grid-cols-3">
        <legend className="px-1 text-sm font-semibold">Interval</legend>
        <Field id={fields.intervalDays.id} label="Check every (days)" errors={fields.intervalDays.errors}>
          <input {...getInputProps(fields.intervalDays, { type: "number" })} min={1} max={730} className={inputClass} />
        </Field>
        <div className="sm:col-span-2">
          <Field id={fields.intervalReason.id} label="Why this interval (kept with the plan)" errors={fields.intervalReason.errors}>
            <textarea {...getTextareaProps(fields.intervalReason)} rows={2} className={inputClass} />
          </Field>
        </div>
      </fieldset>
      <fieldset className="grid gap-4 rounded-md border border-rule p-4 sm:grid-cols-3">
        <legend className="px-1 text-sm font-semibold">Requirement</legend>
        <Field id={fields.toleranceBasis.id} label="Tolerance basis" errors={fields.toleranceBasis.errors}>
          <select {...getSelectProps(fields.toleranceBasis)} className={inputClass}>
            {TOLERANCE_BASES.map((b) => <option key={b} value={b} disabled={b === "oiml_r76_in_service" && !instrument.accuracyClass}>{TOLERANCE_BASIS_LABELS[b]}</option>)}
          </select>
        </Field>
        <Field id={fields.toleranceValue.id} label={basis === "percent_of_load" ? "Tolerance (% of load)" : "Tolerance T (g)"} hint={basis === "usp41" || basis === "oiml_r76_in_service" ? "Derived from the basis; leave empty." : undefined} errors={fields.toleranceValue.errors}>
          <input {...getInputProps(fields.toleranceValue, { type: "text" })} inputMode="decimal" disabled={basis === "usp41" || basis === "oiml_r76_in_service"} className={inputClass} />
        </Field>
        <Field id={fields.safetyFactor.id} label="Safety factor on the minimum weight" errors={fields.safetyFactor.errors}>
          <input {...getInputProps(fields.safetyFactor, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.guardBandPolicy.id} label="Guard band" errors={fields.guardBandPolicy.errors}>
          <select {...getSelectProps(fields.guardBandPolicy)} className={inputClass}>
            {GUARD_BAND_POLICIES.map((p) => <option key={p} value={p}>{GUARD_BAND_LABELS[p]}</option>)}
          </select>
        </Field>
        <Field id={fields.guardBandPercent.id} label="Guard band (% of T)" hint="Used when the guard band is a fraction of T." errors={fields.guardBandPercent.errors}>
          <input {...getInputProps(fields.guardBandPercent, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        {type === "repeatability" ? (
          <Field id={fields.repetitions.id} label="Repetitions" hint="USP <41> asks for at least 10." errors={fields.repetitions.errors}>
            <input {...getInputProps(fields.repetitions, { type: "number" })} min={2} max={30} className={inputClass} />
          </Field>
        ) : null}
      </fieldset>
      <fieldset className="rounded-md border border-rule p-4">
        <legend className="px-1 text-sm font-semibold">Test weights</legend>
        <p className="mb-2 text-sm text-ink-soft">Each weight's class mpe and certificate U must be at most T/3 at its own load (USP &lt;41&gt;). Saving checks it and says why a weight may not serve.</p>
        <div className="grid gap-1 sm:grid-cols-2">
          {weights.filter((w) => Number(w.nominalG) <= Number(instrument.capacityG)).map((w) => (
            <label key={w.id} className="flex items-center gap-2 text-sm">
              <input type="checkbox" name="weightIds" value={w.id} defaultChecked={selected.has(String(w.id))} />
              <span className="num">{w.identifier} · {formatMass(w.nominalG, naturalUnit(w.nominalG))} · {w.weightClass} · U {formatMass(w.expandedUncertaintyG, "mg")} · due {w.dueOn}{w.expired ? " (certificate expired)" : ""}</span>
            </label>
          ))}
        </div>
        {fields.weightIds.errors?.length ? (
          <div id={`${fields.weightIds.id}-error`} role="alert" className="mt-2 space-y-1 text-sm text-out">{fields.weightIds.errors.map((e) => <p key={e}>{e}</p>)}</div>
        ) : null}
      </fieldset>
      <div><Button type="submit">{submitLabel}</Button></div>
    </Form>
  );
}
