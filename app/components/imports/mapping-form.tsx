import { useState } from "react";
import { Form, useNavigation } from "react-router";
import { Button } from "~/components/ui/button";
import { DELIMITER_LABELS, DELIMITERS, ENCODING_LABELS, ENCODINGS, SITE_ZONE, type ColumnMapping, type Delimiter, type Encoding, type ImportField } from "~/lib/csv-mapping";
import { MASS_UNITS } from "../../../db/schema/enums";
import { PreviewTable } from "./preview-table";

interface Props {
  labels: string[];
  rows: string[][];
  suggested: ColumnMapping;
  saved: { id: number; name: string; mapping: ColumnMapping }[];
  read: { encoding: Encoding; delimiter: Delimiter };
  siteZones: { code: string; timeZone: string }[];
  otherZones: string[];
  errors: string[];
}

const select = "rounded-md border border-rule bg-card px-2 py-1.5 text-sm";

export function MappingForm({ labels, rows, suggested, saved, read, siteZones, otherZones, errors }: Props) {
  const [mapping, setMapping] = useState<ColumnMapping>(suggested);
  const navigation = useNavigation();
  const change = (label: string, field: ImportField | "") =>
    setMapping((m) => {
      const next = { ...m };
      if (field) next[label] = field;
      else delete next[label];
      return next;
    });
  const applySaved = (id: string) => {
    const found = saved.find((s) => String(s.id) === id);
    if (found) setMapping(Object.fromEntries(labels.flatMap((l) => (found.mapping[l] ? [[l, found.mapping[l]]] : []))));
  };
  return (
    <div className="grid gap-6">
      <Form method="get" className="flex flex-wrap items-end gap-3 text-sm" aria-label="How the file is read">
        <label className="grid gap-1"><span className="font-medium">Character encoding</span>
          <select name="encoding" defaultValue={read.encoding} className={select}>{ENCODINGS.map((e) => <option key={e} value={e}>{ENCODING_LABELS[e]}</option>)}</select>
        </label>
        <label className="grid gap-1"><span className="font-medium">Between columns</span>
          <select name="delimiter" defaultValue={read.delimiter} className={select}>{DELIMITERS.map((d) => <option key={d} value={d}>{DELIMITER_LABELS[d]}</option>)}</select>
        </label>
        <Button type="submit" variant="secondary">Read the file again</Button>
        <p className="basis-full text-xs text-ink-faint">Tareline told these from the file; change them if the preview looks wrong.</p>
      </Form>
      <Form method="post" className="grid gap-5">
        <input type="hidden" name="encoding" value={read.encoding} />
        <input type="hidden" name="delimiter" value={read.delimiter} />
        {errors.length ? <div role="alert" className="rounded-md border border-out bg-card p-3 text-sm text-out">{errors.map((e) => <p key={e}>{e}</p>)}</div> : null}
        {saved.length ? (
          <label className="grid max-w-sm gap-1 text-sm"><span className="font-medium">Use a saved mapping</span>
            <select defaultValue="" onChange={(e) => applySaved(e.currentTarget.value)} className={select}>
              <option value="">Choose…</option>
              {saved.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
            </select>
          </label>
        ) : null}
        <PreviewTable labels={labels} rows={rows} mapping={mapping} onChange={change} />
        <p className="max-w-3xl text-xs text-ink-faint">
          Asset tag, check type, performed at and readings are needed. Several readings go in one cell separated by "|", or in several columns mapped to Readings; eccentricity takes five, centre first, then front-left, back-left, back-right, front-right. A row without an operator e-mail is recorded under your name.
        </p>
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="grid gap-1"><span className="font-medium">Unit of readings without one</span>
            <select name="unit" defaultValue="g" className={select}>{MASS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}</select>
          </label>
          <label className="grid gap-1"><span className="font-medium">Times without an offset are in</span>
            <select name="timeZone" defaultValue={SITE_ZONE} className={select}>
              <option value={SITE_ZONE}>The zone of each instrument's site</option>
              {siteZones.map((s) => <option key={s.code} value={s.timeZone}>{s.timeZone} ({s.code})</option>)}
              <optgroup label="Other zones">{otherZones.map((z) => <option key={z} value={z}>{z}</option>)}</optgroup>
            </select>
          </label>
          <label className="grid gap-1"><span className="font-medium">Save this mapping as (optional)</span>
            <input name="saveAs" maxLength={80} placeholder="e.g. Weighing-room log export" className={select} />
          </label>
        </div>
        <fieldset className="grid gap-2 text-sm">
          <legend className="mb-1 font-medium">When some rows are rejected</legend>
          <label className="flex gap-2"><input type="radio" name="mode" value="all_or_nothing" defaultChecked /> Import nothing, and give me the report (recommended)</label>
          <label className="flex gap-2"><input type="radio" name="mode" value="valid_rows" /> Import the valid rows, and give me the report of the others</label>
        </fieldset>
        <div>
          <Button type="submit" name="intent" value="start" disabled={navigation.state !== "idle"}>Check every row and import</Button>
        </div>
      </Form>
    </div>
  );
}
