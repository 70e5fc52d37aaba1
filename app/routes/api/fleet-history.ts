import { db } from "~/lib/db.server";
import { FleetParamsSchema } from "~/lib/fleet-params";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { parseSearchParams } from "~/lib/search-params";
import { getFleetHistory } from "~/queries/fleet-history.server";
import type { Route } from "./+types/fleet-history";

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "view_audit");
  const params = parseSearchParams(FleetParamsSchema, request.url);
  return Response.json(await getFleetHistory(db(), viewer, { site: params.site }, new Date()));
}
