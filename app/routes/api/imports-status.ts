// GET /api/v1/imports/:id: status, progress (bytes read of bytes total) and result; polled by the import page.
import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { notFound } from "~/lib/http.server";
import { findImport, importStatusView, settleStale, type ImportStatusView } from "~/queries/imports-status.server";
import type { Route } from "./+types/imports-status";

export type ImportStatusResponse = ImportStatusView;

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  const row = await findImport(db(), viewer, Number(params.id));
  if (!row) return notFound("No import with that id is yours to see.");
  const body: ImportStatusResponse = await importStatusView(await settleStale(db(), row));
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
}
