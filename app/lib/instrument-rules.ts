// OIML R 76-1:2006 Table 3: accuracy class against verification interval e and n = Max/e
// (values as transcribed in REFERENCE.md §2).
import type { AccuracyClass } from "../../db/schema/enums";

interface ClassBand {
  eMin: number;
  eMax: number;
  nMin: number;
  nMax: number;
}

const R76_BANDS: Record<AccuracyClass, ClassBand[]> = {
  I: [{ eMin: 0.001, eMax: Infinity, nMin: 50_000, nMax: Infinity }],
  II: [
    { eMin: 0.001, eMax: 0.05, nMin: 100, nMax: 100_000 },
    { eMin: 0.1, eMax: Infinity, nMin: 5_000, nMax: 100_000 },
  ],
  III: [
    { eMin: 0.1, eMax: 2, nMin: 100, nMax: 10_000 },
    { eMin: 5, eMax: Infinity, nMin: 500, nMax: 10_000 },
  ],
  IIII: [{ eMin: 5, eMax: Infinity, nMin: 100, nMax: 1_000 }],
};

const EPS = 1e-12;

/** Why `accuracyClass` does not fit e (g) and Max (g) under R 76 Table 3, or null when it fits. */
export function classMismatch(accuracyClass: AccuracyClass, eG: number, maxG: number): string | null {
  const n = maxG / eG;
  const bands = R76_BANDS[accuracyClass];
  const byE = bands.filter((b) => eG >= b.eMin - EPS && eG <= b.eMax + EPS);
  if (byE.length === 0) {
    const ranges = bands.map((b) => (b.eMax === Infinity ? `e ≥ ${b.eMin} g` : `${b.eMin} g ≤ e ≤ ${b.eMax} g`)).join(" or ");
    return `Class ${accuracyClass} needs ${ranges} (OIML R 76 Table 3); this instrument has e = ${eG} g.`;
  }
  if (byE.some((b) => n >= b.nMin - EPS && n <= b.nMax + EPS)) return null;
  const b = byE[0];
  const range = b.nMax === Infinity ? `n ≥ ${b.nMin.toLocaleString("en")}` : `${b.nMin.toLocaleString("en")} ≤ n ≤ ${b.nMax.toLocaleString("en")}`;
  return `Class ${accuracyClass} with e = ${eG} g needs ${range} intervals (n = Max/e, OIML R 76 Table 3); this instrument has n = ${Math.round(n).toLocaleString("en")}.`;
}

/** Every class whose R 76 band admits e and n, most accurate first. */
export function fittingClasses(eG: number, maxG: number): AccuracyClass[] {
  return (Object.keys(R76_BANDS) as AccuracyClass[]).filter((c) => classMismatch(c, eG, maxG) === null);
}
