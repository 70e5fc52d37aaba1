// Test-only helper (never imported by the engine): reads the open datasets in ../shared/data beside the
// repository. Suites that need them use `describeWithSharedData`, which skips with a clear title when absent.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe } from "vitest";

export const SHARED_DATA_DIR = path.resolve(process.cwd(), "../shared/data");
export const hasSharedData = existsSync(SHARED_DATA_DIR);

/** describe() that runs only when ../shared/data exists, and says so in its title when it does not. */
export function describeWithSharedData(title: string, body: () => void): void {
  const shown = hasSharedData ? title : `${title} — skipped: ${SHARED_DATA_DIR} not found (copy of shared/ expected beside the repository)`;
  describe.skipIf(!hasSharedData)(shown, body);
}

/** Lines of a data file without its '#' header; none when the folder is absent, so skipped suites still collect. */
function dataLines(file: string): string[] {
  if (!hasSharedData) return [];
  return readFileSync(path.join(SHARED_DATA_DIR, file), "utf8")
    .split(/\r?\n/)
    .filter((line) => line.trim() !== "" && !line.startsWith("#"));
}

/** Numbers of a one-value-per-line .dat file, skipping the '#' provenance header. */
export function readDat(file: string): number[] {
  return dataLines(file).map(Number);
}

/** Rows of a CSV with a header line after the '#' provenance block, as strings keyed by column. */
export function readCsv(file: string): Record<string, string>[] {
  const [header = [], ...rows] = dataLines(file).map((line) => line.split(","));
  return rows.map((cells) => Object.fromEntries(header.map((name, i) => [name, cells[i] ?? ""])));
}

/** Certified value named in a .dat header, e.g. "Sample Mean ybar" → 2.001856. */
export function certifiedValue(file: string, label: string): number {
  const line = readFileSync(path.join(SHARED_DATA_DIR, file), "utf8")
    .split(/\r?\n/)
    .find((l) => l.startsWith("#") && l.includes(label));
  if (!line) throw new Error(`${file}: no header line with "${label}"`);
  return Number(line.split("=").at(-1));
}

/** Log relative error −log10(|x − c|/|c|) as in NIST StRD: the number of correct significant digits (15 when exact). */
export function correctDigits(actual: number, certified: number): number {
  if (actual === certified) return 15;
  return -Math.log10(Math.abs(actual - certified) / Math.abs(certified));
}
