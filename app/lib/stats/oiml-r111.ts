// OIML R 111-1:2004, Table 1 "Maximum permissible errors for weights (± δm in mg)", nominal values 1 mg to 50 kg,
// typed from the transcription in shared/data/OIML_R111-1_2004_Table1_mpe_mg.csv (two web transcriptions that
// agree; M3 at 10 kg to 50 kg from memory only). null = class not defined for that nominal value.
export const WEIGHT_CLASSES = ["E1", "E2", "F1", "F2", "M1", "M2", "M3"] as const;
export type WeightClass = (typeof WEIGHT_CLASSES)[number];

type Row = [nominalGrams: number, ...mpeMg: (number | null)[]];

const TABLE_1: readonly Row[] = [
  [0.001, 0.003, 0.006, 0.020, 0.06, 0.20, null, null],
  [0.002, 0.003, 0.006, 0.020, 0.06, 0.20, null, null],
  [0.005, 0.003, 0.006, 0.020, 0.06, 0.20, null, null],
  [0.01, 0.003, 0.008, 0.025, 0.08, 0.25, null, null],
  [0.02, 0.003, 0.010, 0.03, 0.10, 0.3, null, null],
  [0.05, 0.004, 0.012, 0.04, 0.12, 0.4, null, null],
  [0.1, 0.005, 0.016, 0.05, 0.16, 0.5, 1.6, null],
  [0.2, 0.006, 0.020, 0.06, 0.20, 0.6, 2.0, null],
  [0.5, 0.008, 0.025, 0.08, 0.25, 0.8, 2.5, null],
  [1, 0.010, 0.030, 0.10, 0.30, 1.0, 3.0, 10],
  [2, 0.012, 0.040, 0.12, 0.40, 1.2, 4.0, 12],
  [5, 0.016, 0.050, 0.16, 0.50, 1.6, 5.0, 16],
  [10, 0.020, 0.060, 0.20, 0.60, 2.0, 6.0, 20],
  [20, 0.025, 0.080, 0.25, 0.80, 2.5, 8.0, 25],
  [50, 0.030, 0.10, 0.30, 1.0, 3.0, 10, 30],
  [100, 0.05, 0.16, 0.5, 1.6, 5.0, 16, 50],
  [200, 0.10, 0.30, 1.0, 3.0, 10, 30, 100],
  [500, 0.25, 0.80, 2.5, 8.0, 25, 80, 250],
  [1000, 0.50, 1.6, 5.0, 16, 50, 160, 500],
  [2000, 1.0, 3.0, 10, 30, 100, 300, 1000],
  [5000, 2.5, 8.0, 25, 80, 250, 800, 2500],
  [10000, 5, 16, 50, 160, 500, 1600, 5000],
  [20000, 10, 30, 100, 300, 1000, 3000, 10000],
  [50000, 25, 80, 250, 800, 2500, 8000, 25000],
];

/** Nominal values (g) that Table 1 lists, ascending. */
export const WEIGHT_NOMINALS_G: readonly number[] = TABLE_1.map((row) => row[0]);

/** Class mpe in mg for a nominal value in grams listed in Table 1 (1 mg … 50 kg); null when the value or class is not listed. */
export function weightClassMpeMg(weightClass: WeightClass, nominalGrams: number): number | null {
  const column = WEIGHT_CLASSES.indexOf(weightClass) + 1;
  const row = TABLE_1.find(([nominal]) => Math.abs(nominal - nominalGrams) <= 1e-9 * nominal);
  return row?.[column] ?? null;
}

/** Class mpe in grams (Table 1 value / 1000); null when not listed. */
export function weightClassMpeGrams(weightClass: WeightClass, nominalGrams: number): number | null {
  const mg = weightClassMpeMg(weightClass, nominalGrams);
  return mg === null ? null : mg / 1000;
}
