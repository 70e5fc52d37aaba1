const MS_PER_DAY = 86_400_000;
/** The range of a JavaScript Date: ±100 000 000 days around 1970. */
const MAX_INSTANT_MS = 8.64e15;
// Date-only, or date-time with an explicit offset: a local time without offset would depend on the time zone.
const ISO_INSTANT = /^\d{4}-\d{2}-\d{2}(?:T\d{2}:\d{2}(?::\d{2}(?:\.\d{1,9})?)?(?:Z|[+-]\d{2}:\d{2}))?$/;

/** Milliseconds since the epoch of an ISO 8601 date ("2024-05-01", read as UTC) or date-time with Z or ±hh:mm; NaN otherwise. */
export function parseIsoInstant(text: string): number {
  if (isCanonicalShape(text)) return canonicalUtc(text);
  if (!ISO_INSTANT.test(text)) return Number.NaN;
  return Date.parse(text);
}

/** Days since the first time, (tᵢ − t₀)/86 400 000 ms; throws RangeError on an unparseable or decreasing time; empty in, empty out. */
export function daysSinceFirst(times: readonly string[]): Float64Array {
  const days = new Float64Array(times.length);
  let origin = Number.NaN;
  let previous = -Infinity;
  for (let i = 0; i < times.length; i++) {
    const ms = parseIsoInstant(times[i]);
    if (Number.isNaN(ms)) throw new RangeError(`Time ${i + 1} is not an ISO 8601 date or date-time with an offset: "${times[i]}"`);
    if (ms < previous) throw new RangeError(`Time ${i + 1} is earlier than the time before it`);
    if (i === 0) origin = ms;
    previous = ms;
    days[i] = (ms - origin) / MS_PER_DAY;
  }
  return days;
}

/** Days since the first instant, (tᵢ − t₀)/86 400 000 for times in epoch milliseconds (UTC); throws RangeError on a non-finite, out-of-range (|t| > 8.64e15) or decreasing time; empty in, empty out. */
export function daysSinceFirstMs(times: ArrayLike<number>): Float64Array {
  const days = new Float64Array(times.length);
  const origin = times[0];
  let previous = -Infinity;
  for (let i = 0; i < times.length; i++) {
    const ms = times[i];
    if (!(Math.abs(ms) <= MAX_INSTANT_MS)) throw new RangeError(`Time ${i + 1} is not an instant in epoch milliseconds: ${ms}`);
    if (ms < previous) throw new RangeError(`Time ${i + 1} is earlier than the time before it`);
    previous = ms;
    days[i] = (ms - origin) / MS_PER_DAY;
  }
  return days;
}

/** Point indexes 0, 1, …, n − 1 as a trend axis "per point". */
export function pointAxis(n: number): Float64Array {
  const axis = new Float64Array(n);
  for (let i = 0; i < n; i++) axis[i] = i;
  return axis;
}

/** ISO 8601 UTC string of the instant `days` after the first time; null for a non-finite day count or a date out of range. */
export function isoAfterFirst(firstTime: string, days: number): string | null {
  return isoAfterFirstMs(parseIsoInstant(firstTime), days);
}

/** ISO 8601 UTC string of the instant `days` after `firstMs` (epoch milliseconds); null for a non-finite result or a date out of range. */
export function isoAfterFirstMs(firstMs: number, days: number): string | null {
  const ms = firstMs + days * MS_PER_DAY;
  if (!Number.isFinite(ms) || Math.abs(ms) > MAX_INSTANT_MS) return null;
  return new Date(Math.round(ms)).toISOString();
}

// toISOString() output (YYYY-MM-DDTHH:MM:SS.sssZ) is by far the most common form; reading it by hand costs a tenth of Date.parse.
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function canonicalUtc(text: string): number {
  const year = digitsAt(text, 0, 4);
  const month = digitsAt(text, 5, 7);
  const day = digitsAt(text, 8, 10);
  const hour = digitsAt(text, 11, 13);
  const minute = digitsAt(text, 14, 16);
  const second = digitsAt(text, 17, 19);
  const leap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (!(month >= 1 && month <= 12)) return Number.NaN;
  const monthDays = month === 2 && leap ? 29 : DAYS_IN_MONTH[month - 1];
  const millisecond = digitsAt(text, 20, 23);
  if (!(day >= 1 && day <= monthDays && hour <= 23 && minute <= 59 && second <= 59 && millisecond >= 0)) return Number.NaN;
  return daysFromCivil(year, month, day) * MS_PER_DAY + ((hour * 60 + minute) * 60 + second) * 1000 + millisecond;
}

/** Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant's days_from_civil), without allocating a Date. */
function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const dayOfYear = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146_097 + dayOfEra - 719_468;
}

/** Separators of the canonical shape; the digits are checked while they are read. */
function isCanonicalShape(text: string): boolean {
  return (
    text.length === 24 &&
    text.charCodeAt(4) === 45 && // -
    text.charCodeAt(7) === 45 &&
    text.charCodeAt(10) === 84 && // T
    text.charCodeAt(13) === 58 && // :
    text.charCodeAt(16) === 58 &&
    text.charCodeAt(19) === 46 && // .
    text.charCodeAt(23) === 90 // Z
  );
}

/** Decimal value of text[from, to), NaN if any character is not a digit. */
function digitsAt(text: string, from: number, to: number): number {
  let value = 0;
  for (let i = from; i < to; i++) {
    const digit = text.charCodeAt(i) - 48;
    if (digit < 0 || digit > 9) return Number.NaN;
    value = value * 10 + digit;
  }
  return value;
}
