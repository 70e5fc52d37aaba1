import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { rangeBounds, SeriesParamsSchema } from "~/lib/series-params";
import { parseSearchParams } from "~/lib/search-params";
import { getInstrumentApi } from "~/queries/instruments.server";
import { getInstrumentSeries } from "~/queries/series.server";
import type { Route } from "./+types/instrument-series";

export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  const query = parseSearchParams(SeriesParamsSchema, request.url);
  const instrument = await getInstrumentApi(db(), viewer, Number(params.id));
  const now = new Date();
  return Response.json(await getInstrumentSeries(db(), instrument, query.type, rangeBounds(query, now), now));
}
