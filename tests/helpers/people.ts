import { DEMO_PEOPLE } from "../../db/seed/people";

const byRole = (role: string) => DEMO_PEOPLE.find((p) => p.role === role)!.email;

export const ADMIN = byRole("admin");
export const METROLOGIST = byRole("metrologist");
export const SITE_MANAGER = byRole("site_manager");
export const TECHNICIAN = DEMO_PEOPLE.find((p) => p.role === "technician" && p.siteCodes.includes("AVP"))!.email;
export const ANALYST = byRole("analyst");
