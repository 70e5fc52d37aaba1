import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { getInstrumentApi } from "~/queries/instruments.server";
import type { Route } from "./+types/instrument";

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  return Response.json(await getInstrumentApi(db(), viewer, Number(params.id)));
}
