// Check times from a file: ISO 8601 with an offset, or a wall-clock time read in a chosen IANA zone through Intl.
// A wall time that a clock change skips or repeats is refused rather than guessed.
const TIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const QUARTER_HOUR = 900_000;
const HALF_DAY = 43_200_000;
const FUTURE_SLACK_MS = 5 * 60_000;

export type CheckTime = { ok: true; at: Date; hadOffset: boolean } | { ok: false; message: string };

interface WallTime {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  millisecond: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();
const offsets = new Map<string, Map<number, number>>();

function formatter(zone: string): Intl.DateTimeFormat {
  let f = formatters.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", { timeZone: zone, hourCycle: "h23", year: "numeric", month: "numeric", day: "numeric", hour: "numeric", minute: "numeric", second: "numeric" });
    formatters.set(zone, f);
  }
  return f;
}

function exactOffset(zone: string, utcMs: number): number {
  const parts: Record<string, number> = {};
  for (const p of formatter(zone).formatToParts(utcMs)) if (p.type !== "literal") parts[p.type] = Number(p.value);
  const wall = Date.UTC(parts.year, parts.month - 1, parts.day, parts.hour, parts.minute, parts.second);
  return wall - Math.floor(utcMs / 1000) * 1000;
}

/** The zone's offset from UTC (ms, east positive) at an instant; cached per quarter hour unless a change falls inside it. */
export function zoneOffsetMs(zone: string, utcMs: number): number {
  const bucket = Math.floor(utcMs / QUARTER_HOUR);
  let cache = offsets.get(zone);
  if (!cache) offsets.set(zone, (cache = new Map()));
  const hit = cache.get(bucket);
  if (hit !== undefined) return hit;
  const start = exactOffset(zone, bucket * QUARTER_HOUR);
  const end = exactOffset(zone, bucket * QUARTER_HOUR + QUARTER_HOUR - 1000);
  if (start !== end) return exactOffset(zone, utcMs);
  if (cache.size > 200_000) cache.clear();
  cache.set(bucket, start);
  return start;
}

/** The instant a wall-clock time names in `zone`: one instant, or the reason there is none ("gap") or two ("overlap"). */
export function wallTimeToInstant(wall: WallTime, zone: string): { ok: true; ms: number } | { ok: false; reason: "gap" | "overlap" } {
  const local = Date.UTC(wall.year, wall.month - 1, wall.day, wall.hour, wall.minute, wall.second, wall.millisecond);
  const candidates = new Set([local - zoneOffsetMs(zone, local - HALF_DAY), local - zoneOffsetMs(zone, local + HALF_DAY)]);
  const valid = [...candidates].filter((ms) => ms + zoneOffsetMs(zone, ms) === local);
  if (valid.length === 1) return { ok: true, ms: valid[0] };
  return { ok: false, reason: valid.length === 0 ? "gap" : "overlap" };
}

function offsetMs(text: string): number {
  if (text.toUpperCase() === "Z") return 0;
  const sign = text.startsWith("-") ? -1 : 1;
  const digits = text.slice(1).replace(":", "");
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4) || "0")) * 60_000;
}

const daysIn = (year: number, month: number) => new Date(Date.UTC(year, month, 0)).getUTCDate();

/** Reads a check time: `YYYY-MM-DD HH:MM[:SS[.fff]]`, `T` or a space between, an optional `Z` or ±HH[:MM] offset. */
export function parseCheckTime(text: string, zone: string, now: Date): CheckTime {
  const m = TIME.exec(text.trim());
  if (!m) return { ok: false, message: `"${text.trim().slice(0, 60)}" is not a time Tareline reads: write it as YYYY-MM-DD HH:MM (seconds and an offset such as +01:00 or Z are optional).` };
  const wall: WallTime = { year: +m[1], month: +m[2], day: +m[3], hour: +m[4], minute: +m[5], second: +(m[6] ?? 0), millisecond: Math.floor(Number(`0.${m[7] ?? "0"}`) * 1000) };
  if (wall.month < 1 || wall.month > 12 || wall.day < 1 || wall.day > daysIn(wall.year, wall.month) || wall.hour > 23 || wall.minute > 59 || wall.second > 59) {
    return { ok: false, message: `"${text.trim()}" is not a real date and time.` };
  }
  // Date.UTC reads years 0–99 as 1900–1999; no check history reaches that far back anyway.
  if (wall.year < 1970) return { ok: false, message: `${m[1]} is not a plausible year for a check; Tareline reads check times from 1970 on.` };
  if (m[8] && Math.abs(offsetMs(m[8])) > 14 * 3_600_000) return { ok: false, message: `The offset ${m[8]} is not one any time zone uses.` };
  let ms: number;
  if (m[8]) {
    ms = Date.UTC(wall.year, wall.month - 1, wall.day, wall.hour, wall.minute, wall.second, wall.millisecond) - offsetMs(m[8]);
  } else {
    const found = wallTimeToInstant(wall, zone);
    if (!found.ok) {
      const why = found.reason === "gap" ? "does not exist there: the clocks were put forward over it" : "happens twice there: the clocks were put back over it";
      return { ok: false, message: `${text.trim()} in ${zone} ${why}. Add the offset (for example +01:00) to say which instant is meant.` };
    }
    ms = found.ms;
  }
  if (ms > now.getTime() + FUTURE_SLACK_MS) return { ok: false, message: `${new Date(ms).toISOString()} is in the future; a check can only be imported once it has been done.` };
  return { ok: true, at: new Date(ms), hadOffset: Boolean(m[8]) };
}
