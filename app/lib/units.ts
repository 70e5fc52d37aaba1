// Masses travel as decimal strings until the edge: shifting the decimal point converts units exactly.
import type { MassUnit } from "../../db/schema/enums";

const EXPONENT: Record<MassUnit, number> = { mg: -3, g: 0, kg: 3 };
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;

export function isDecimal(text: string): boolean {
  return DECIMAL.test(text.trim());
}

/** Digits after the decimal point as typed ("10.000" → 3, "5" → 0). */
export function decimalsOf(text: string): number {
  const dot = text.trim().indexOf(".");
  return dot === -1 ? 0 : text.trim().length - dot - 1;
}

/** Moves the decimal point of a decimal string by `shift` places (positive: larger), without floats. */
export function shiftDecimal(text: string, shift: number): string {
  const trimmed = text.trim();
  const negative = trimmed.startsWith("-");
  const unsigned = trimmed.replace(/^[+-]/, "");
  const [whole, fraction = ""] = unsigned.split(".");
  let digits = whole + fraction;
  let point = whole.length + shift;
  if (point <= 0) {
    digits = "0".repeat(1 - point) + digits;
    point = 1;
  }
  if (point > digits.length) digits += "0".repeat(point - digits.length);
  const intPart = digits.slice(0, point).replace(/^0+(?=\d)/, "");
  const fracPart = digits.slice(point).replace(/0+$/, "");
  const out = fracPart ? `${intPart}.${fracPart}` : intPart;
  return negative && /[1-9]/.test(out) ? `-${out}` : out;
}

/** "12.5" mg → "0.0125" g, exactly. */
export function toGrams(text: string, unit: MassUnit): string {
  return shiftDecimal(text, EXPONENT[unit]);
}

export function fromGrams(grams: string, unit: MassUnit): string {
  return shiftDecimal(grams, -EXPONENT[unit]);
}

/** Decimal places a value in `unit` may carry for an instrument whose readability is `readabilityG`. */
export function decimalsAllowed(readabilityG: string, unit: MassUnit): number {
  return Math.max(0, decimalsOf(fromGrams(readabilityG, unit)));
}

/** Formats grams for display in `unit` with exactly the digits the readability allows, unit included. */
export function formatMass(grams: number | string, unit: MassUnit, readabilityG?: string): string {
  const value = typeof grams === "number" ? grams / 10 ** EXPONENT[unit] : Number(fromGrams(grams, unit));
  const digits = readabilityG ? decimalsAllowed(readabilityG, unit) : undefined;
  const text = digits === undefined ? String(value) : value.toFixed(digits);
  return `${text} ${unit}`;
}

/** The unit a person would read a mass in: below 1 g in mg, from 1 kg in kg. */
export function naturalUnit(grams: string): MassUnit {
  const g = Number(grams);
  if (g < 1) return "mg";
  if (g >= 1000) return "kg";
  return "g";
}

/** An uncertainty to two significant digits, as calibration certificates state them. */
export function formatUncertainty(grams: number, unit: MassUnit): string {
  return `${Number((grams / 10 ** EXPONENT[unit]).toPrecision(2))} ${unit}`;
}
