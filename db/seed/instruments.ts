// The invented fleet: kinds and their typical Max, d, e and class. Asset tags are SITE-KIND-NN.
import type { AccuracyClass, InstrumentKind, MassUnit } from "../schema/enums";

export interface InstrumentSpec {
  kind: InstrumentKind;
  tag: string;
  capacityG: string;
  readabilityG: string;
  verificationIntervalG: string;
  displayUnit: MassUnit;
  accuracyClass: AccuracyClass | null;
  smallestNetWeightG: string;
  riskLevel: "low" | "medium" | "high";
}

const MODELS: Omit<InstrumentSpec, "tag" | "riskLevel">[] = [
  { kind: "micro_balance", capacityG: "6.1", readabilityG: "0.000001", verificationIntervalG: "0.001", displayUnit: "mg", accuracyClass: "II", smallestNetWeightG: "0.01" },
  { kind: "semi_micro_balance", capacityG: "120", readabilityG: "0.00001", verificationIntervalG: "0.001", displayUnit: "g", accuracyClass: "I", smallestNetWeightG: "0.05" },
  { kind: "analytical_balance", capacityG: "220", readabilityG: "0.0001", verificationIntervalG: "0.001", displayUnit: "g", accuracyClass: "I", smallestNetWeightG: "0.5" },
  { kind: "precision_balance", capacityG: "6200", readabilityG: "0.01", verificationIntervalG: "0.1", displayUnit: "g", accuracyClass: "II", smallestNetWeightG: "50" },
  { kind: "bench_scale", capacityG: "60000", readabilityG: "2", verificationIntervalG: "20", displayUnit: "kg", accuracyClass: "III", smallestNetWeightG: "10000" },
  { kind: "floor_scale", capacityG: "600000", readabilityG: "100", verificationIntervalG: "100", displayUnit: "kg", accuracyClass: "III", smallestNetWeightG: "250000" },
];

// The repeatability story (DESIGN.md §6): a semi-micro balance weighing 30 mg portions, so its worsening s shows.
const STORY_OVERRIDES: Record<string, Partial<InstrumentSpec>> = {
  "AVP-SM-02": { smallestNetWeightG: "0.03" },
};

const CODES: Record<InstrumentKind, string> = {
  micro_balance: "MB",
  semi_micro_balance: "SM",
  analytical_balance: "AB",
  precision_balance: "PB",
  bench_scale: "BS",
  floor_scale: "FS",
};

// How many of each kind a site keeps: the lab sites weigh small, the plant weighs large.
const SITE_MIX: Record<string, Partial<Record<InstrumentKind, number>>> = {
  AVP: { micro_balance: 2, semi_micro_balance: 3, analytical_balance: 6, precision_balance: 3, bench_scale: 1 },
  QNW: { analytical_balance: 3, precision_balance: 4, bench_scale: 4, floor_scale: 3 },
  LNT: { semi_micro_balance: 1, analytical_balance: 5, precision_balance: 3, bench_scale: 1 },
};

export function fleetFor(siteCode: string): InstrumentSpec[] {
  const specs: InstrumentSpec[] = [];
  for (const model of MODELS) {
    const countOfKind = SITE_MIX[siteCode]?.[model.kind] ?? 0;
    for (let i = 1; i <= countOfKind; i++) {
      const riskLevel = model.kind === "micro_balance" || model.kind === "semi_micro_balance" || (model.kind === "analytical_balance" && i <= 3) ? "high" : model.kind === "floor_scale" ? "low" : "medium";
      const tag = `${siteCode}-${CODES[model.kind]}-${String(i).padStart(2, "0")}`;
      specs.push({ ...model, tag, riskLevel, ...STORY_OVERRIDES[tag] });
    }
  }
  return specs;
}

export const ROOMS: Record<string, string[]> = {
  AVP: ["Weighing room 1", "Weighing room 2", "Stability lab"],
  QNW: ["Dispensary", "Goods in", "Packing hall"],
  LNT: ["Sample prep", "Weighing suite"],
};
