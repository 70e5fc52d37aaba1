// Expected instants: Date.UTC and Date.parse of the same calendar values (C); the fast path is cross-checked against Date.parse.
import { describe, expect, it } from "vitest";
import { daysSinceFirst, isoAfterFirst, parseIsoInstant } from "./time-axis";

describe("parseIsoInstant: no hidden time zone", () => {
  it.each([
    ["2025-03-10", Date.UTC(2025, 2, 10)],
    ["2025-03-10T08:30:00.000Z", Date.UTC(2025, 2, 10, 8, 30)],
    ["2025-03-10T08:30:00+02:00", Date.UTC(2025, 2, 10, 6, 30)],
    ["2024-02-29T23:59:59.999Z", Date.UTC(2024, 1, 29, 23, 59, 59, 999)],
    ["2025-03-10T08:30", NaN],
    ["2023-02-29T00:00:00.000Z", NaN],
    ["2025-13-01T00:00:00.000Z", NaN],
    ["2025-03-1xT00:00:00.000Z", NaN],
    ["yesterday", NaN],
  ])("%s", (text, expected) => {
    if (Number.isNaN(expected)) expect(parseIsoInstant(text)).toBeNaN();
    else expect(parseIsoInstant(text)).toBe(expected);
  });
  it("the fast path agrees with Date.parse across five centuries", () => {
    for (let ms = Date.UTC(1800, 0, 1); ms < Date.UTC(2300, 0, 1); ms += 86_400_000 * 7.77) {
      const iso = new Date(Math.round(ms)).toISOString();
      expect(parseIsoInstant(iso)).toBe(Date.parse(iso));
    }
  });
  it("days since the first time, and back to an ISO instant", () => {
    expect(Array.from(daysSinceFirst(["2025-01-01T00:00:00.000Z", "2025-01-01T12:00:00.000Z", "2025-01-03"]))).toEqual([0, 0.5, 2]);
    expect(isoAfterFirst("2025-01-01", 31.5)).toBe("2025-02-01T12:00:00.000Z");
    expect(isoAfterFirst("2025-01-01", Infinity)).toBeNull();
    expect(() => daysSinceFirst(["2025-01-02", "2025-01-01"])).toThrow(RangeError);
  });
});
