import { describe, expect, it } from "vitest";
import { addDays, daysBetween, localDate, occurrences, planDue, weekStarts } from "./schedule";

describe("calendar arithmetic", () => {
  it.each([
    ["2026-01-31", 1, "2026-02-01"],
    ["2026-02-28", 1, "2026-03-01"],
    ["2028-02-28", 1, "2028-02-29"],
    ["2026-12-31", 1, "2027-01-01"],
    ["2026-03-01", -1, "2026-02-28"],
    ["2026-01-31", 30, "2026-03-02"],
  ])("%s + %i days = %s", (from, days, to) => {
    expect(addDays(from, days)).toBe(to);
    expect(daysBetween(from, to)).toBe(days);
  });

  it("reads the calendar date in the site's zone, not UTC", () => {
    const lateEvening = new Date("2026-03-31T23:30:00Z");
    expect(localDate(lateEvening, "Europe/Berlin")).toBe("2026-04-01");
    expect(localDate(lateEvening, "America/Chicago")).toBe("2026-03-31");
    expect(localDate(lateEvening, "Europe/London")).toBe("2026-04-01");
  });
});

describe("due and overdue in the site's local day", () => {
  const base = { planCreatedAt: new Date("2025-01-01T00:00:00Z") };

  it("a daily check done late on the last day of the month is due on the first, overdue on the second (Berlin)", () => {
    const lastValidAt = new Date("2026-01-31T22:30:00Z"); // 23:30 in Berlin, 31 January
    const due = (now: string) => planDue({ ...base, lastValidAt, intervalDays: 1, timeZone: "Europe/Berlin", now: new Date(now) });
    expect(due("2026-02-01T08:00:00Z")).toMatchObject({ dueOn: "2026-02-01", state: "due_today", daysOverdue: 0 });
    expect(due("2026-02-01T23:30:00Z")).toMatchObject({ today: "2026-02-02", state: "overdue", daysOverdue: 1 });
  });

  it("the same instant is a day earlier in Chicago, so the plan falls due a day earlier there", () => {
    const lastValidAt = new Date("2026-02-01T03:00:00Z"); // 21:00 on 31 January in Chicago
    expect(planDue({ ...base, lastValidAt, intervalDays: 1, timeZone: "America/Chicago", now: new Date("2026-02-01T15:00:00Z") }).state).toBe("due_today");
    expect(planDue({ ...base, lastValidAt, intervalDays: 1, timeZone: "Europe/London", now: new Date("2026-02-01T15:00:00Z") }).state).toBe("due_this_week");
  });

  it("a 30-day plan keeps its calendar across a month end and the spring clock change", () => {
    const lastValidAt = new Date("2026-03-15T10:00:00Z");
    const due = planDue({ ...base, lastValidAt, intervalDays: 30, timeZone: "Europe/London", now: new Date("2026-04-14T00:30:00+01:00") });
    expect(due).toMatchObject({ dueOn: "2026-04-14", today: "2026-04-14", state: "due_today" });
  });

  it("a plan never checked is due from the day it was made", () => {
    const due = planDue({ lastValidAt: null, planCreatedAt: new Date("2026-05-04T09:00:00Z"), intervalDays: 7, timeZone: "Europe/London", now: new Date("2026-05-06T09:00:00Z") });
    expect(due).toMatchObject({ neverChecked: true, dueOn: "2026-05-04", state: "overdue", daysOverdue: 2 });
  });

  it("marks plans due within six days as due this week, later ones as later", () => {
    const now = new Date("2026-06-01T12:00:00Z");
    const at = (d: string) => planDue({ ...base, lastValidAt: new Date(`${d}T12:00:00Z`), intervalDays: 7, timeZone: "UTC", now });
    expect(at("2026-05-27").state).toBe("due_this_week");
    expect(at("2026-05-25").state).toBe("due_today");
    expect(at("2026-06-01").state).toBe("later");
  });
});

describe("the eight-week timeline", () => {
  it("projects a weekly plan from its due date, and an overdue plan from today", () => {
    expect(occurrences({ dueOn: "2026-06-03", today: "2026-06-01" }, 7, 21)).toEqual(["2026-06-03", "2026-06-10", "2026-06-17"]);
    expect(occurrences({ dueOn: "2026-05-20", today: "2026-06-01" }, 14, 28)).toEqual(["2026-06-01", "2026-06-15"]);
  });

  it("starts on the Monday of the current week", () => {
    expect(weekStarts("2026-01-01", 2)).toEqual(["2025-12-29", "2026-01-05"]);
  });
});
