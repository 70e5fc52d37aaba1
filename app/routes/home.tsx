import { redirect } from "react-router";
import { requireViewer } from "~/lib/guards.server";
import { primaryRole } from "~/lib/permissions";
import type { Route } from "./+types/home";

// Each role lands where its work starts.
const LANDING = {
  admin: "/admin",
  metrologist: "/instruments",
  site_manager: "/fleet",
  technician: "/checks-due",
  analyst: "/instruments",
} as const;

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const role = primaryRole(viewer);
  return redirect(role ? LANDING[role] : "/not-registered");
}
