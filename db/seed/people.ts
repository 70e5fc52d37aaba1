// The invented demo scenario's people. Shared by the seed, the identity-provider fake and the sign-in page.
import type { Role } from "../schema/enums";

export interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  siteCodes: string[];
  // Check procedures the person is trained on; "expired:" marks a lapsed record.
  training: string[];
}

export const DEMO_COMPANY = "Quillmere Testing Laboratories (invented)";

export const DEMO_SITES = [
  { code: "AVP", name: "Averly Park laboratory", timeZone: "Europe/London" },
  { code: "QNW", name: "Quenby Wharf plant", timeZone: "Europe/Berlin" },
  { code: "LNT", name: "Lintmoor contract lab", timeZone: "America/Chicago" },
] as const;

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "ada.admin@quillmere.test", name: "Ada Pellworth", role: "admin", siteCodes: ["AVP"], training: [] },
  { email: "milo.metrologist@quillmere.test", name: "Milo Ferrante", role: "metrologist", siteCodes: ["AVP", "QNW"], training: ["sensitivity", "repeatability", "eccentricity"] },
  { email: "sana.manager@quillmere.test", name: "Sana Okonkwo-Hale", role: "site_manager", siteCodes: ["AVP", "QNW", "LNT"], training: [] },
  { email: "tomas.technician@quillmere.test", name: "Tomas Varga-Lind", role: "technician", siteCodes: ["AVP"], training: ["sensitivity", "repeatability", "eccentricity"] },
  { email: "rhea.technician@quillmere.test", name: "Rhea Castellane", role: "technician", siteCodes: ["QNW"], training: ["sensitivity", "expired:repeatability"] },
  { email: "lio.technician@quillmere.test", name: "Lio Marchetti-Sand", role: "technician", siteCodes: ["LNT"], training: ["sensitivity", "repeatability", "eccentricity"] },
  { email: "anil.analyst@quillmere.test", name: "Anil Brookhart", role: "analyst", siteCodes: ["AVP", "QNW", "LNT"], training: [] },
];

export function demoPersonByEmail(email: string): DemoPerson | undefined {
  return DEMO_PEOPLE.find((p) => p.email === email.toLowerCase());
}
