import { getFormProps, getInputProps, getSelectProps, useForm, type SubmissionResult } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { Form } from "react-router";
import { Button } from "~/components/ui/button";
import { Field, inputClass } from "~/components/ui/field";
import { MASS_UNITS } from "../../../db/schema/enums";
import { ASTM_CLASSES, R111_CLASSES, WeightFormSchema } from "./weight-form-schema";

interface Props {
  lastResult?: SubmissionResult<string[]> | null;
  defaultValue?: Record<string, string | undefined>;
  sites: { id: number; code: string; name: string }[];
  submitLabel: string;
  certificateError?: string | null;
}

export function WeightForm({ lastResult, defaultValue, sites, submitLabel, certificateError }: Props) {
  const [form, fields] = useForm({ lastResult, defaultValue, shouldValidate: "onBlur", shouldRevalidate: "onInput", onValidate: ({ formData }) => parseWithZod(formData, { schema: WeightFormSchema }) });
  return (
    <Form method="post" encType="multipart/form-data" {...getFormProps(form)} className="grid max-w-3xl gap-5">
      {form.errors?.length ? <p role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{form.errors.join(" ")}</p> : null}
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id={fields.identifier.id} label="Identifier" errors={fields.identifier.errors}>
          <input {...getInputProps(fields.identifier, { type: "text" })} className={inputClass} />
        </Field>
        <Field id={fields.setLabel.id} label="Part of set (optional)" hint="Pieces of one set share a label." errors={fields.setLabel.errors}>
          <input {...getInputProps(fields.setLabel, { type: "text" })} className={inputClass} />
        </Field>
        <Field id={fields.siteId.id} label="Custodian site" errors={fields.siteId.errors}>
          <select {...getSelectProps(fields.siteId)} className={inputClass}>
            <option value="">Choose…</option>
            {sites.map((s) => <option key={s.id} value={s.id}>{s.code} · {s.name}</option>)}
          </select>
        </Field>
      </div>
      <fieldset className="grid gap-4 rounded-md border border-rule p-4 sm:grid-cols-4">
        <legend className="px-1 text-sm font-semibold">From the calibration certificate</legend>
        <Field id={fields.unit.id} label="Unit of the masses" errors={fields.unit.errors}>
          <select {...getSelectProps(fields.unit)} className={inputClass}>{MASS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}</select>
        </Field>
        <Field id={fields.nominal.id} label="Nominal value" errors={fields.nominal.errors}>
          <input {...getInputProps(fields.nominal, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.conventionalMass.id} label="Conventional mass" errors={fields.conventionalMass.errors}>
          <input {...getInputProps(fields.conventionalMass, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.uncertaintyMg.id} label="Expanded uncertainty U (k = 2), mg" errors={fields.uncertaintyMg.errors}>
          <input {...getInputProps(fields.uncertaintyMg, { type: "text" })} inputMode="decimal" className={inputClass} />
        </Field>
        <Field id={fields.weightClass.id} label="Class" errors={fields.weightClass.errors}>
          <select {...getSelectProps(fields.weightClass)} className={inputClass}>
            <option value="">Choose…</option>
            <optgroup label="OIML R 111">{R111_CLASSES.map((c) => <option key={c} value={c}>{c}</option>)}</optgroup>
            <optgroup label="ASTM E617">{ASTM_CLASSES.map((c) => <option key={c} value={c}>{c}</option>)}</optgroup>
          </select>
        </Field>
        <Field id={fields.certificateNumber.id} label="Certificate number" errors={fields.certificateNumber.errors}>
          <input {...getInputProps(fields.certificateNumber, { type: "text" })} className={inputClass} />
        </Field>
        <Field id={fields.calibratedOn.id} label="Calibrated on" errors={fields.calibratedOn.errors}>
          <input {...getInputProps(fields.calibratedOn, { type: "date" })} className={inputClass} />
        </Field>
        <Field id={fields.dueOn.id} label="Due for recalibration" errors={fields.dueOn.errors}>
          <input {...getInputProps(fields.dueOn, { type: "date" })} className={inputClass} />
        </Field>
      </fieldset>
      <Field id="certificate" label="Certificate file (PDF, PNG or JPEG, at most 10 MB)" hint="Checked by content. A new file is kept beside the old one, never over it." errors={certificateError ? [certificateError] : undefined}>
        <input id="certificate" name="certificate" type="file" accept="application/pdf,image/png,image/jpeg" className="text-sm" />
      </Field>
      <div><Button type="submit">{submitLabel}</Button></div>
    </Form>
  );
}
