// The role table, shared by server guards and the UI (which only hides what the server refuses).
import type { Role } from "../../db/schema/enums";

export type Capability =
  | "view"
  | "manage_instruments"
  | "record_check"
  | "import_csv"
  | "export_csv"
  | "review_points"
  | "manage_training"
  | "view_training"
  | "view_audit"
  | "administer";

const ROLE_CAPABILITIES: Record<Role, readonly Capability[]> = {
  admin: ["view", "manage_instruments", "import_csv", "export_csv", "manage_training", "view_training", "view_audit", "administer"],
  metrologist: ["view", "manage_instruments", "record_check", "import_csv", "export_csv", "review_points", "manage_training", "view_training", "view_audit"],
  site_manager: ["view", "export_csv", "view_training", "view_audit"],
  technician: ["view", "record_check"],
  analyst: ["view", "export_csv", "view_audit"],
};

export interface Viewer {
  id: number;
  email: string;
  name: string;
  memberships: { siteId: number; role: Role }[];
}

/** An admin membership anywhere makes a person an admin of every site. */
export function isAdmin(viewer: Viewer): boolean {
  return viewer.memberships.some((m) => m.role === "admin");
}

export function roleAt(viewer: Viewer, siteId: number): Role | null {
  if (isAdmin(viewer)) return "admin";
  return viewer.memberships.find((m) => m.siteId === siteId)?.role ?? null;
}

/** Whether the viewer holds `capability` at `siteId`, or at any of their sites when no site is named. */
export function can(viewer: Viewer, capability: Capability, siteId?: number): boolean {
  if (siteId !== undefined) {
    const role = roleAt(viewer, siteId);
    return role !== null && ROLE_CAPABILITIES[role].includes(capability);
  }
  if (isAdmin(viewer)) return ROLE_CAPABILITIES.admin.includes(capability);
  return viewer.memberships.some((m) => ROLE_CAPABILITIES[m.role].includes(capability));
}

/** Site ids the viewer may see; null means every site (admins). */
export function visibleSiteIds(viewer: Viewer): number[] | null {
  return isAdmin(viewer) ? null : viewer.memberships.map((m) => m.siteId);
}

export function primaryRole(viewer: Viewer): Role | null {
  if (isAdmin(viewer)) return "admin";
  const order: Role[] = ["metrologist", "site_manager", "technician", "analyst"];
  return order.find((r) => viewer.memberships.some((m) => m.role === r)) ?? null;
}

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  metrologist: "Metrologist",
  site_manager: "Site manager",
  technician: "Technician",
  analyst: "Analyst",
};
