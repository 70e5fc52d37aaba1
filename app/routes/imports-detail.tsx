import { data, Link, redirect } from "react-router";
import { ImportStatusPanel } from "~/components/imports/import-status-panel";
import { MappingForm } from "~/components/imports/mapping-form";
import { PageHeader } from "~/components/ui/page-header";
import { readStoredImport } from "~/lib/csv-import-record";
import { DELIMITERS, ENCODINGS, IMPORT_FIELDS, ImportSettingsSchema, suggestMapping, type ColumnMapping, type ImportField } from "~/lib/csv-mapping";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { notFoundPage } from "~/lib/http.server";
import { can, type Viewer } from "~/lib/permissions";
import { listSitesAndRooms } from "~/queries/instruments.server";
import { ImportRefused, startImport } from "~/queries/imports-job.server";
import { listMappings, saveMapping } from "~/queries/imports-mappings.server";
import { readPreview } from "~/queries/imports-preview.server";
import { findImport, importStatusView, settleStale } from "~/queries/imports-status.server";
import type { Route } from "./+types/imports-detail";

export const meta = ({ data }: Route.MetaArgs) => [{ title: `${data?.status.filename ?? "Import"} · Tareline` }];

async function load(request: Request, id: string | undefined) {
  const viewer = await requireCapability(request, "import_csv");
  const row = await findImport(db(), viewer, Number(id));
  if (!row) throw notFoundPage("No import with that id is yours to see.");
  return { viewer, row: await settleStale(db(), row) };
}

/** Encoding and delimiter as detected on upload, unless the person chose others to read the file with. */
function readSettings(url: URL | FormData, detected: { encoding: (typeof ENCODINGS)[number]; delimiter: (typeof DELIMITERS)[number] }) {
  const get = (name: string) => (url instanceof URL ? url.searchParams.get(name) : url.get(name));
  return { encoding: ENCODINGS.find((e) => e === get("encoding")) ?? detected.encoding, delimiter: DELIMITERS.find((d) => d === get("delimiter")) ?? detected.delimiter };
}

async function siteZones(viewer: Viewer) {
  const { sites } = await listSitesAndRooms(db(), viewer);
  return sites.filter((s) => can(viewer, "import_csv", s.id)).map((s) => ({ code: s.code, timeZone: s.timeZone }));
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { viewer, row } = await load(request, params.id);
  const status = await importStatusView(row);
  const { file, upload } = readStoredImport(row.mapping);
  if (status.status !== "mapping" || !file || !upload) return { status, mapping: null };
  const read = readSettings(new URL(request.url), file);
  const preview = await readPreview(upload, read).catch(() => null);
  if (!preview) return { status: { ...status, error: "The uploaded file is no longer kept; upload it again." }, mapping: null };
  const zones = await siteZones(viewer);
  return {
    status,
    mapping: { ...preview, read, suggested: suggestMapping(preview.labels), saved: await listMappings(db()), siteZones: zones, otherZones: Intl.supportedValuesOf("timeZone").filter((z) => !zones.some((s) => s.timeZone === z)) },
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { viewer, row } = await load(request, params.id);
  const form = await request.formData();
  const stored = readStoredImport(row.mapping);
  try {
    if (form.get("intent") === "import-valid-rows") {
      if (!stored.settings) return data({ errors: ["This import has no settings to run again."] }, { status: 400 });
      await startImport(db(), viewer, row.id, { ...stored.settings, mode: "valid_rows" });
      return redirect(`/imports/${row.id}`);
    }
    if (!stored.file || !stored.upload) return data({ errors: ["The uploaded file is no longer kept; upload it again."] }, { status: 409 });
    const read = readSettings(form, stored.file);
    const { labels } = await readPreview(stored.upload, read);
    const mapping: ColumnMapping = {};
    labels.forEach((label, i) => {
      const field = IMPORT_FIELDS.find((f) => f === form.get(`map:${i}`));
      if (field) mapping[label] = field as ImportField;
    });
    const parsed = ImportSettingsSchema.safeParse({ mapping, unit: form.get("unit"), timeZone: form.get("timeZone"), mode: form.get("mode"), ...read });
    if (!parsed.success) return data({ errors: parsed.error.issues.map((i) => i.message) }, { status: 400 });
    const saveAs = String(form.get("saveAs") ?? "").trim().slice(0, 80);
    if (saveAs) await saveMapping(db(), viewer, saveAs, mapping);
    await startImport(db(), viewer, row.id, parsed.data);
    return redirect(`/imports/${row.id}`);
  } catch (error) {
    if (error instanceof ImportRefused) return data({ errors: [error.message] }, { status: error.status === 404 ? 404 : 409 });
    throw error;
  }
}

export default function ImportDetail({ loaderData, actionData }: Route.ComponentProps) {
  const { status, mapping } = loaderData;
  return (
    <>
      <PageHeader title={status.filename} subtitle={mapping ? "Map the file's columns to Tareline's fields, then every row is checked before anything is written." : "Import of check history"} />
      <p className="mb-4 text-sm"><Link to="/imports" className="text-accent underline">All imports</Link></p>
      {mapping ? <MappingForm key={`${mapping.read.encoding}${mapping.read.delimiter}`} {...mapping} errors={actionData?.errors ?? []} /> : <ImportStatusPanel key={status.status} initial={status} />}
    </>
  );
}
