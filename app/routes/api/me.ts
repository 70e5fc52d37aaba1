import { requireApiViewer } from "~/lib/guards.server";
import { isAdmin } from "~/lib/permissions";
import type { Route } from "./+types/me";

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  return Response.json({ id: viewer.id, email: viewer.email, name: viewer.name, admin: isAdmin(viewer), memberships: viewer.memberships });
}
