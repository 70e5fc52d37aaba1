import { db } from "~/lib/db.server";
import { FleetParamsSchema } from "~/lib/fleet-params";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { problem } from "~/lib/http.server";
import { parseSearchParams } from "~/lib/search-params";
import { FLEET_HISTORY_MAX_IDS, getFleetHistory } from "~/queries/fleet-history.server";
import type { Route } from "./+types/fleet-history";

/** `?ids=3,1,2` narrows to those instruments in that order (at most 200); without it, every visible instrument. */
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "view_audit");
  const params = parseSearchParams(FleetParamsSchema, request.url);
  const raw = new URL(request.url).searchParams.get("ids");
  const ids = raw === null || raw === "" ? undefined : raw.split(",").map((v) => Number(v.trim()));
  if (ids && (ids.some((id) => !Number.isInteger(id) || id <= 0) || ids.length > FLEET_HISTORY_MAX_IDS)) {
    return problem(400, "Invalid instrument list", `ids is a comma-separated list of at most ${FLEET_HISTORY_MAX_IDS} instrument ids.`, [{ pointer: "/ids", message: "Give positive whole numbers separated by commas." }]);
  }
  return Response.json(await getFleetHistory(db(), viewer, { site: params.site, ids }, new Date()));
}
