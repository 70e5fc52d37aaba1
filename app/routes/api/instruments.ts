import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { InstrumentListParamsSchema, parseSearchParams } from "~/lib/search-params";
import { listInstruments } from "~/queries/instruments.server";
import type { Route } from "./+types/instruments";

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  const params = parseSearchParams(InstrumentListParamsSchema, request.url);
  return Response.json(await listInstruments(db(), viewer, params));
}
