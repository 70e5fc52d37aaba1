import { describe, expect, it } from "vitest";
import { MAX_ANALYZE_VALUES, parseAnalyzeRequest } from "./analyze-request";

describe("parseAnalyzeRequest", () => {
  it("accepts a full, valid body", () => {
    const body = {
      values: [100.0001, 100.0002, 100.0001],
      times: ["2025-01-01T08:00:00.000Z", "2025-01-02", "2025-01-02T09:00:00+01:00"],
      resolution: 0.0001,
      baseline: { count: 20 },
      rules: ["nelson-1", "we-2"],
      ewma: { lambda: 0.2, L: 3 },
      cusum: false,
      tolerance: { upper: 100.1, lower: 99.9, guardBand: 0.03 },
    };
    const parsed = parseAnalyzeRequest(body);
    expect(parsed).toEqual({ ok: true, value: body });
  });

  it.each([
    { name: "a value that is not a number", body: { values: [1, "2", 3] }, pointer: "/values/1" },
    { name: "a value that is not finite (1e999 parses to Infinity)", body: JSON.parse('{"values":[1,2,1e999]}'), pointer: "/values/2" },
    { name: "no values", body: { values: [] }, pointer: "/values" },
    { name: "too many values", body: { values: Array(MAX_ANALYZE_VALUES + 1).fill(1) }, pointer: "/values" },
    { name: "lengths differ", body: { values: [1, 2], times: ["2025-01-01"] }, pointer: "/times" },
    { name: "times decreasing", body: { values: [1, 2, 3], times: ["2025-01-01", "2025-01-03", "2025-01-02"] }, pointer: "/times/2" },
    { name: "a local time without offset", body: { values: [1], times: ["2025-01-01T08:00"] }, pointer: "/times/0" },
    { name: "unknown rule id", body: { values: [1], rules: ["nelson-1", "nelson-9"] }, pointer: "/rules/1" },
    { name: "unknown rule set", body: { values: [1], rules: "shewhart" }, pointer: "/rules" },
    { name: "λ above 1", body: { values: [1], ewma: { lambda: 1.5, L: 3 } }, pointer: "/ewma/lambda" },
    { name: "λ of 0", body: { values: [1], ewma: { lambda: 0, L: 3 } }, pointer: "/ewma/lambda" },
    { name: "negative CUSUM h", body: { values: [1], cusum: { k: 0.5, h: -1 } }, pointer: "/cusum/h" },
    { name: "baseline sigma 0", body: { values: [1], baseline: { center: 1, sigma: 0 } }, pointer: "/baseline/sigma" },
    { name: "tolerance with neither limit", body: { values: [1], tolerance: { guardBand: 0.1 } }, pointer: "/tolerance" },
    { name: "lower tolerance above upper", body: { values: [1], tolerance: { upper: 1, lower: 2 } }, pointer: "/tolerance/lower" },
    { name: "an unknown member", body: { values: [1], colour: "red" }, pointer: "" },
    { name: "not an object", body: [1, 2, 3], pointer: "" },
  ])("rejects $name at $pointer", ({ body, pointer }) => {
    const parsed = parseAnalyzeRequest(body);
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(parsed.problems.map((p) => p.pointer)).toContain(pointer);
    for (const problem of parsed.problems) expect(problem.message.length).toBeGreaterThan(0);
  });

  it("says which rule ids exist", () => {
    const parsed = parseAnalyzeRequest({ values: [1], rules: ["nelson-9"] });
    expect(parsed.ok ? "" : parsed.problems.map((p) => p.message).join(" ")).toMatch(/we-1/);
  });
});
