// OIML R 76-1:2006 Tables 3 and 6 as transcribed in REFERENCE.md §2; in-service mpe = 2 × initial
// (EU non-automatic weighing instruments directive, Annex I §4.2).
export const ACCURACY_CLASSES = ["I", "II", "III", "IIII"] as const;
export type AccuracyClass = (typeof ACCURACY_CLASSES)[number];

/** Upper ends (in e) of the ±0.5 e and ±1.0 e load bands on initial verification; above them ±1.5 e. */
const MPE_BANDS: Record<AccuracyClass, [number, number]> = {
  I: [50_000, 200_000],
  II: [5_000, 20_000],
  III: [500, 2_000],
  IIII: [50, 200],
};

interface ClassRow {
  eFrom: number;
  eTo: number;
  nMin: number;
  nMax: number;
}

const CLASS_ROWS: Record<AccuracyClass, ClassRow[]> = {
  I: [{ eFrom: 0.001, eTo: Infinity, nMin: 50_000, nMax: Infinity }],
  II: [
    { eFrom: 0.001, eTo: 0.05, nMin: 100, nMax: 100_000 },
    { eFrom: 0.1, eTo: Infinity, nMin: 5_000, nMax: 100_000 },
  ],
  III: [
    { eFrom: 0.1, eTo: 2, nMin: 100, nMax: 10_000 },
    { eFrom: 5, eTo: Infinity, nMin: 500, nMax: 10_000 },
  ],
  IIII: [{ eFrom: 5, eTo: Infinity, nMin: 100, nMax: 1_000 }],
};

/** Load in units of e, rounded to 1e−9 so that 0.5 g / 0.001 g is exactly 500. */
function loadInE(load: number, e: number): number {
  return Math.round((Math.abs(load) / e) * 1e9) / 1e9;
}

/** Initial-verification mpe (g) for class, e (g) and load (g): 0.5 e / 1.0 e / 1.5 e by load band, band ends inclusive; NaN for e ≤ 0. */
export function initialVerificationMpe(accuracyClass: AccuracyClass, e: number, load: number): number {
  if (!(e > 0)) return Number.NaN;
  const m = loadInE(load, e);
  const [halfUpTo, oneUpTo] = MPE_BANDS[accuracyClass];
  return (m <= halfUpTo ? 0.5 : m <= oneUpTo ? 1 : 1.5) * e;
}

/** In-service mpe (g) = 2 × initial-verification mpe; class III, e = 1 g: 400 g → 1 g, 1500 g → 2 g, 6000 g → 3 g. */
export function inServiceMpe(accuracyClass: AccuracyClass, e: number, load: number): number {
  return 2 * initialVerificationMpe(accuracyClass, e, load);
}

/** OIML R 76 eccentricity test load ≈ Max/3 for up to four supports (including additive tare), Max/(n − 1) for n > 4, g. */
export function eccentricityTestLoad(max: number, supports = 4, maxAdditiveTare = 0): number {
  return supports > 4 ? max / (supports - 1) : (max + maxAdditiveTare) / 3;
}

/** Warning sentence when class, e (g) and n = Max/e disagree with R 76 Table 3, or null when they agree; nothing is checked for e or Max ≤ 0. */
export function classConsistencyWarning(accuracyClass: AccuracyClass, e: number, max: number): string | null {
  if (!(e > 0) || !(max > 0)) return null;
  const n = Math.round((max / e) * 1e6) / 1e6;
  const rows = CLASS_ROWS[accuracyClass];
  const row = rows.find((r) => e >= r.eFrom * (1 - 1e-9) && e <= r.eTo * (1 + 1e-9));
  const advice = "Check the data plate and the verification certificate.";
  if (!row) {
    const ranges = rows.map((r) => (r.eTo === Infinity ? `at least ${r.eFrom} g` : `${r.eFrom} g to ${r.eTo} g`)).join(" or ");
    return `OIML R 76 allows e = ${ranges} for class ${accuracyClass}, not ${e} g. ${advice}`;
  }
  if (n < row.nMin) return `Max/e = ${formatCount(n)} is below the ${formatCount(row.nMin)} that OIML R 76 requires for class ${accuracyClass} with e = ${e} g. ${advice}`;
  if (n > row.nMax) return `Max/e = ${formatCount(n)} is above the ${formatCount(row.nMax)} that OIML R 76 allows for class ${accuracyClass} with e = ${e} g. ${advice}`;
  return null;
}

/** SI digit grouping with a thin space (100 000), no locale involved. */
function formatCount(n: number): string {
  const [whole, fraction] = String(n).split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, "\u2009");
  return fraction === undefined ? grouped : `${grouped}.${fraction}`;
}
