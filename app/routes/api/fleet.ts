import { db } from "~/lib/db.server";
import { FleetParamsSchema } from "~/lib/fleet-params";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { parseSearchParams } from "~/lib/search-params";
import { compareSites, listFleet } from "~/queries/fleet-overview.server";
import type { Route } from "./+types/fleet";

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "view_audit");
  const params = parseSearchParams(FleetParamsSchema, request.url);
  const rows = await listFleet(db(), viewer, params, new Date());
  return Response.json({ rows, sites: compareSites(rows) });
}
