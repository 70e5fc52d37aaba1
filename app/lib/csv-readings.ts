// Readings in a file: one or more columns, each holding one reading or several separated by "|",
// each possibly followed by its unit ("100.0003 g"). The unit of a row comes from its unit column,
// else from the units written in its cells, else from the default chosen on the form.
import { MASS_UNITS, type MassUnit } from "../../db/schema/enums";
import { ECCENTRICITY_POSITIONS } from "./check-readings";

const UNIT_SUFFIX = /\s*(mg|g|kg)$/i;

/** Every reading of a row in file order: cells split on "|", trimmed, empty pieces dropped. */
export function splitReadings(cells: string[]): string[] {
  const pieces: string[] = [];
  for (const cell of cells) {
    for (const piece of cell.split("|")) {
      const trimmed = piece.trim();
      if (trimmed) pieces.push(trimmed);
    }
  }
  return pieces;
}

export type RowUnit = { ok: true; unit: MassUnit } | { ok: false; message: string };

/** The unit a row's readings are in; refuses a unit column Tareline does not know and cells that disagree. */
export function rowUnit(unitCell: string | undefined, readings: string[], fallback: MassUnit): RowUnit {
  const named = unitCell?.trim().toLowerCase();
  if (named) {
    const unit = MASS_UNITS.find((u) => u === named);
    return unit ? { ok: true, unit } : { ok: false, message: `"${unitCell}" is not a unit Tareline reads; use ${MASS_UNITS.join(", ")}.` };
  }
  const written = new Set<MassUnit>();
  for (const r of readings) {
    const m = UNIT_SUFFIX.exec(r);
    if (m) written.add(m[1].toLowerCase() as MassUnit);
  }
  if (written.size > 1) return { ok: false, message: `The readings of one check must share one unit; this line has ${[...written].join(" and ")}.` };
  return { ok: true, unit: [...written][0] ?? fallback };
}

/** The shape parseReadings expects: a list, or for eccentricity the five positions in their fixed order. */
export function readingsInput(type: "sensitivity" | "repeatability" | "eccentricity", readings: string[]): { ok: true; value: unknown } | { ok: false; message: string } {
  if (type !== "eccentricity") return { ok: true, value: readings };
  if (readings.length !== ECCENTRICITY_POSITIONS.length) {
    return { ok: false, message: `An eccentricity check needs ${ECCENTRICITY_POSITIONS.length} readings in the order ${ECCENTRICITY_POSITIONS.join(", ")}; this line has ${readings.length}.` };
  }
  return { ok: true, value: Object.fromEntries(ECCENTRICITY_POSITIONS.map((p, i) => [p, readings[i]])) };
}
