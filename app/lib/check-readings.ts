// Readings arrive as typed text (or JSON numbers) and are checked against the instrument's readability
// before anything is computed: a reading with more decimals than d allows was not read off this instrument.
import type { MassUnit } from "../../db/schema/enums";
import { decimalsAllowed, decimalsOf, isDecimal, toGrams } from "./units";

export const ECCENTRICITY_POSITIONS = ["centre", "front-left", "back-left", "back-right", "front-right"] as const;
export type EccentricityPosition = (typeof ECCENTRICITY_POSITIONS)[number];

export interface ReadingProblem {
  pointer: string;
  message: string;
}

export interface ParsedReading {
  /** Exactly as entered, in the check's unit (stored in `check_readings.value`). */
  entered: string;
  grams: number;
  position: EccentricityPosition | null;
}

/** Normalises one reading: trims, accepts a decimal comma and a trailing unit equal to the check's unit. */
export function readingText(raw: unknown, unit: MassUnit): string | null {
  if (typeof raw === "number") return Number.isFinite(raw) ? String(raw) : null;
  if (typeof raw !== "string") return null;
  let text = raw.trim().replace(/\s+/g, " ");
  const withUnit = /^(.*?)\s*(mg|g|kg)$/i.exec(text);
  if (withUnit) {
    if (withUnit[2].toLowerCase() !== unit) return null;
    text = withUnit[1];
  }
  if (/^[+-]?\d+,\d+$/.test(text)) text = text.replace(",", ".");
  return isDecimal(text) ? text : null;
}

function parseOne(raw: unknown, unit: MassUnit, readabilityG: string, pointer: string, position: EccentricityPosition | null): ParsedReading | ReadingProblem {
  const text = readingText(raw, unit);
  if (text === null) return { pointer, message: `"${String(raw ?? "")}" is not a reading in ${unit}.` };
  if (text.startsWith("-")) return { pointer, message: "A reading of a test load cannot be negative." };
  const allowed = decimalsAllowed(readabilityG, unit);
  if (decimalsOf(text) > allowed) {
    return { pointer, message: `${text} ${unit} has more decimals than this instrument shows (d allows ${allowed} in ${unit}).` };
  }
  return { entered: text, grams: Number(toGrams(text, unit)), position };
}

/** Parses a list of readings (sensitivity, repeatability) or the five eccentricity positions. */
export function parseReadings(
  raw: unknown,
  options: { type: "sensitivity" | "repeatability" | "eccentricity"; unit: MassUnit; readabilityG: string; minCount?: number },
): { ok: true; readings: ParsedReading[] } | { ok: false; problems: ReadingProblem[] } {
  const results: (ParsedReading | ReadingProblem)[] = [];
  if (options.type === "eccentricity") {
    if (!raw || typeof raw !== "object" || Array.isArray(raw)) {
      return { ok: false, problems: [{ pointer: "/readings", message: `Give one reading for each position: ${ECCENTRICITY_POSITIONS.join(", ")}.` }] };
    }
    const byPosition = raw as Record<string, unknown>;
    for (const position of ECCENTRICITY_POSITIONS) {
      if (byPosition[position] === undefined || byPosition[position] === "") results.push({ pointer: `/readings/${position}`, message: `The ${position} reading is missing.` });
      else results.push(parseOne(byPosition[position], options.unit, options.readabilityG, `/readings/${position}`, position));
    }
  } else {
    const list = Array.isArray(raw) ? raw.filter((v) => v !== "" && v !== null && v !== undefined) : [];
    const minimum = options.minCount ?? (options.type === "repeatability" ? 6 : 1);
    if (list.length < minimum) {
      const what = options.type === "repeatability" ? `at least ${minimum} readings of the same load (USP <41> asks for 10; the trade uses 6 to 10)` : "at least one reading";
      return { ok: false, problems: [{ pointer: "/readings", message: `Give ${what}.` }] };
    }
    list.forEach((value, i) => results.push(parseOne(value, options.unit, options.readabilityG, `/readings/${i}`, null)));
  }
  const problems = results.filter((r): r is ReadingProblem => "pointer" in r);
  return problems.length ? { ok: false, problems } : { ok: true, readings: results as ParsedReading[] };
}
