import { getFormProps, getInputProps, getSelectProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { Button } from "~/components/ui/button";
import { Field, inputClass } from "~/components/ui/field";
import { InstrumentFormSchema, KIND_LABELS, LEGAL_CLASS_NONE } from "~/lib/instrument-form";
import { ACCURACY_CLASSES, INSTRUMENT_KINDS, MASS_UNITS } from "../../../db/schema/enums";

interface Props {
  lastResult?: SubmissionResult<string[]> | null;
  defaultValue?: Record<string, string | undefined>;
  sites: { id: number; code: string; name: string }[];
  rooms: { id: number; siteId: number; name: string }[];
  submitLabel: string;
}

export function InstrumentForm({ lastResult, defaultValue, sites, rooms, submitLabel }: Props) {
  const [form, fields] = useForm({
    lastResult,
    defaultValue,
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
    onValidate: ({ formData }) => parseWithZod(formData, { schema: InstrumentFormSchema }),
  });
  const siteId = Number(fields.siteId.value ?? defaultValue?.siteId);
  return (
    <Form method="post" {...getFormProps(form)} className="grid max-w-3xl gap-5">
      {form.errors?.length ? <p role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{form.errors.join(" ")}</p> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field id={fields.assetTag.id} label="Asset tag" errors={fields.assetTag.errors}>
          <input {...getInputProps(fields.assetTag, { type: "text" })} className={inputClass} />
        </Field>
        <Field id={fields.kind.id} label="Kind" errors={fields.kind.errors}>
          <select {...getSelectProps(fields.kind)} className={inputClass}>
            <option value="">Choose…</option>
            {INSTRUMENT_KINDS.map((k) => <option key={k} value={k}>{KIND_LABELS[k]}</option>)}
          </select>
        </Field>
        <Field id={fields.siteId.id} label="Site" errors={fields.siteId.errors}>
          <select {...getSelectProps(fields.siteId)} className={inputClass}>
            <option value="">Choose…</option>
            {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
          </select>
        </Field>
        <Field id={fields.roomId.id} label="Room" errors={fields.roomId.errors}>
          <select {...getSelectProps(fields.roomId)} className={inputClass}>
            <option value="">No room</option>
            {rooms.filter((r) => !siteId || r.siteId === siteId).map((r) => <option key={r.id} value={r.id}>{r.name}</option>)}
          </select>
        </Field>
        <Field id={fields.description.id} label="Description" errors={fields.description.errors}>
          <input {...getInputProps(fields.description, { type: "text" })} className={inputClass} />
        </Field>
        <Field id={fields.serialNumber.id} label="Serial number" errors={fields.serialNumber.errors}>
          <input {...getInputProps(fields.serialNumber, { type: "text" })} className={inputClass} />
        </Field>
      </div>
      <fieldset className="grid gap-4 rounded-md border border-rule p-4 sm:grid-cols-4">
        <legend className="px-1 text-sm font-semibold">Metrology (OIML R 76 terms)</legend>
        <Field id={fields.unit.id} label="Unit of Max, d, e" errors={fields.unit.errors}>
          <select {...getSelectProps(fields.unit)} className={inputClass}>
            <option value="">Choose…</option>
            {MASS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
          </select>
        </Field>
        <Field id={fields.capacity.id} label="Max (capacity)" errors={fields.capacity.errors}>
          <input {...getInputProps(fields.capacity, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.readability.id} label="d (readability)" errors={fields.readability.errors}>
          <input {...getInputProps(fields.readability, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.verificationInterval.id} label="e (verification interval)" errors={fields.verificationInterval.errors}>
          <input {...getInputProps(fields.verificationInterval, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <div className="sm:col-span-4">
          <Field id={fields.accuracyClass.id} label="Accuracy class" hint="Checked against OIML R 76 Table 3 (e and n = Max/e)." errors={fields.accuracyClass.errors}>
            <select {...getSelectProps(fields.accuracyClass)} className={`${inputClass} max-w-xs`}>
              <option value="">Choose…</option>
              {ACCURACY_CLASSES.map((c) => <option key={c} value={c}>Class {c}</option>)}
              <option value={LEGAL_CLASS_NONE}>Not a legal-metrology instrument</option>
            </select>
          </Field>
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id={fields.smallestNetWeight.id} label="Smallest net weight used" hint="The smallest quantity the process weighs on it." errors={fields.smallestNetWeight.errors}>
          <input {...getInputProps(fields.smallestNetWeight, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.smallestNetWeightUnit.id} label="Its unit" errors={fields.smallestNetWeightUnit.errors}>
          <select {...getSelectProps(fields.smallestNetWeightUnit)} className={inputClass}>
            {MASS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
          </select>
        </Field>
        <Field id={fields.riskLevel.id} label="Risk level" errors={fields.riskLevel.errors}>
          <select {...getSelectProps(fields.riskLevel)} className={inputClass}>
            <option value="low">Low</option>
            <option value="medium">Medium</option>
            <option value="high">High</option>
          </select>
        </Field>
      </div>
      <div>
        <Button type="submit">{submitLabel}</Button>
      </div>
    </Form>
  );
}
