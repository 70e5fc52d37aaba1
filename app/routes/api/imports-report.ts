// GET /api/v1/imports/:id/report.csv: every rejected or duplicate row with its line, column and reason.
import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { notFound } from "~/lib/http.server";
import { reportStream } from "~/queries/imports-report.server";
import { findImport } from "~/queries/imports-status.server";
import type { Route } from "./+types/imports-report";

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  const row = await findImport(db(), viewer, Number(params.id));
  if (!row) return notFound("No import with that id is yours to see.");
  const name = `import-${row.id}-report.csv`;
  return new Response(await reportStream(db(), row.id), {
    headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${name}"`, "Cache-Control": "no-store" },
  });
}
