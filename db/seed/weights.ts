// Test weights per site, each with an invented certificate; one certificate falls due soon (DESIGN.md §6).
import { demoToday } from "./random";

const day = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);

const SETS: Record<string, { nominalG: string; weightClass: string }[]> = {
  AVP: [
    { nominalG: "0.01", weightClass: "E2" },
    { nominalG: "1", weightClass: "E2" },
    { nominalG: "10", weightClass: "E2" },
    { nominalG: "100", weightClass: "E2" },
    { nominalG: "200", weightClass: "E2" },
    { nominalG: "5000", weightClass: "F1" },
  ],
  QNW: [
    { nominalG: "100", weightClass: "F1" },
    { nominalG: "200", weightClass: "F1" },
    { nominalG: "5000", weightClass: "F1" },
    { nominalG: "20000", weightClass: "M1" },
    { nominalG: "50000", weightClass: "M1" },
  ],
  LNT: [
    { nominalG: "1", weightClass: "E2" },
    { nominalG: "100", weightClass: "E2" },
    { nominalG: "200", weightClass: "F1" },
    { nominalG: "5000", weightClass: "F1" },
  ],
};

export function weightsFor(siteCode: string, siteId: number, random: () => number) {
  return SETS[siteCode].map((w, i) => {
    // Deviation from nominal and certificate U well inside the class mpe; U about a quarter of the mpe.
    const nominal = Number(w.nominalG);
    const scale = nominal * (w.weightClass.startsWith("E") ? 1.6e-6 : w.weightClass === "F1" ? 5e-6 : 5e-5);
    const deviation = (random() - 0.5) * scale;
    const calibratedOn = new Date(demoToday().getTime() - (siteCode === "AVP" && i === 3 ? 350 : 120 + i * 20) * day);
    return {
      siteId,
      identifier: `${siteCode}-W-${String(i + 1).padStart(2, "0")}`,
      nominalG: w.nominalG,
      weightClass: w.weightClass,
      conventionalMassG: (nominal + deviation).toFixed(8).replace(/0+$/, "").replace(/\.$/, ""),
      expandedUncertaintyG: (Math.max(scale / 4, 1e-7)).toPrecision(2),
      certificateNumber: `CAL-${siteCode}-${2026 - (i % 2)}-${1000 + i * 37}`,
      calibratedOn: isoDate(calibratedOn),
      dueOn: isoDate(new Date(calibratedOn.getTime() + 365 * day)),
    };
  });
}
