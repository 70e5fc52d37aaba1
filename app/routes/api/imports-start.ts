// POST /api/v1/imports/:id/start with the mapping and options as JSON: validates every row, then imports.
// 202 while it runs; poll GET /api/v1/imports/:id.
import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { forbidden, notFound, problem } from "~/lib/http.server";
import { ImportSettingsSchema } from "~/lib/csv-mapping";
import { can } from "~/lib/permissions";
import { ImportRefused, startImport } from "~/queries/imports-job.server";
import { findImport, importStatusView } from "~/queries/imports-status.server";
import type { Route } from "./+types/imports-start";

export async function action({ request, params }: Route.ActionArgs) {
  const viewer = await requireApiViewer(request);
  if (!can(viewer, "import_csv")) return forbidden("Your role does not import checks.");
  const row = await findImport(db(), viewer, Number(params.id));
  if (!row) return notFound("No import with that id is yours to see.");
  const body: unknown = await request.json().catch(() => null);
  const parsed = ImportSettingsSchema.safeParse(body);
  if (!parsed.success) {
    const errors = parsed.error.issues.map((i) => ({ pointer: `/${i.path.join("/")}`, message: i.message }));
    return problem(422, "Invalid import settings", errors.map((e) => e.message).join(" "), errors);
  }
  try {
    await startImport(db(), viewer, row.id, parsed.data);
  } catch (error) {
    if (error instanceof ImportRefused) return problem(error.status, "Import not started", error.message);
    throw error;
  }
  const started = await findImport(db(), viewer, row.id);
  return Response.json(started ? await importStatusView(started) : { id: row.id }, { status: 202, headers: { Location: `/api/v1/imports/${row.id}` } });
}
