import { describe, expect, it } from "vitest";
import { parseCheckTime, zoneOffsetMs } from "./csv-time";

const now = new Date("2026-12-01T12:00:00Z");
const at = (text: string, zone = "Europe/London") => {
  const r = parseCheckTime(text, zone, now);
  return r.ok ? r.at.toISOString() : r.message;
};

describe("parseCheckTime", () => {
  it("reads an offset or Z as given, whatever the zone", () => {
    expect(at("2026-03-02T08:15:00+01:00", "America/Chicago")).toBe("2026-03-02T07:15:00.000Z");
    expect(at("2026-03-02 08:15Z")).toBe("2026-03-02T08:15:00.000Z");
    expect(at("2026-03-02T08:15:30.250-0530")).toBe("2026-03-02T13:45:30.250Z");
  });

  it("reads a wall time in the chosen zone, winter and summer (Europe/London: UTC+0 then UTC+1)", () => {
    expect(at("2026-01-15 09:00")).toBe("2026-01-15T09:00:00.000Z");
    expect(at("2026-07-15 09:00")).toBe("2026-07-15T08:00:00.000Z");
    expect(at("2026-07-15 09:00", "Europe/Berlin")).toBe("2026-07-15T07:00:00.000Z");
    expect(at("2026-07-15 09:00", "America/Chicago")).toBe("2026-07-15T14:00:00.000Z");
  });

  it("converts across the spring change (29 March 2026, 01:00 UTC, London goes to BST)", () => {
    expect(at("2026-03-29 00:59:59")).toBe("2026-03-29T00:59:59.000Z");
    expect(at("2026-03-29 02:00")).toBe("2026-03-29T01:00:00.000Z");
    expect(at("2026-03-29 01:30")).toMatch(/does not exist there: the clocks were put forward/);
  });

  it("refuses a wall time the autumn change repeats (25 October 2026, 01:00–02:00 in London)", () => {
    expect(at("2026-10-25 01:30")).toMatch(/happens twice there/);
    expect(at("2026-10-25 01:30+01:00")).toBe("2026-10-25T00:30:00.000Z");
    expect(at("2026-10-25 01:30+00:00")).toBe("2026-10-25T01:30:00.000Z");
    expect(at("2026-10-25 02:00")).toBe("2026-10-25T02:00:00.000Z");
  });

  it("handles a southern-hemisphere change (Australia/Sydney, 5 April 2026 03:00 → 02:00)", () => {
    expect(at("2026-04-05 02:30", "Australia/Sydney")).toMatch(/happens twice/);
    expect(at("2026-04-06 02:30", "Australia/Sydney")).toBe("2026-04-05T16:30:00.000Z");
  });

  it.each(["02/03/2026 08:15", "2026-03-02", "yesterday", "45123.5", "2026-3-2 8:15"])("refuses %s with the format to use", (text) => {
    expect(at(text)).toMatch(/is not a time Tareline reads: write it as YYYY-MM-DD HH:MM/);
  });

  it.each(["2026-02-30 08:00", "2026-13-01 08:00", "2026-01-01 24:00"])("refuses the impossible %s", (text) => {
    expect(at(text)).toMatch(/is not a real date and time/);
  });

  it("refuses a year before 1970 instead of reading 0026 as 1926", () => {
    expect(at("0026-11-02 08:15")).toBe("0026 is not a plausible year for a check; Tareline reads check times from 1970 on.");
  });

  it("refuses a time in the future, allowing five minutes of clock skew", () => {
    expect(at("2026-12-01T12:04:00Z")).toBe("2026-12-01T12:04:00.000Z");
    expect(at("2026-12-01T12:06:00Z")).toMatch(/is in the future/);
  });
});

describe("zoneOffsetMs", () => {
  it("matches Intl on either side of a change, cached or not", () => {
    const before = Date.UTC(2026, 2, 29, 0, 59, 59);
    expect(zoneOffsetMs("Europe/London", before)).toBe(0);
    expect(zoneOffsetMs("Europe/London", before + 1000)).toBe(3_600_000);
    expect(zoneOffsetMs("Europe/London", before)).toBe(0);
    expect(zoneOffsetMs("Asia/Kolkata", before)).toBe(19_800_000);
  });
});
