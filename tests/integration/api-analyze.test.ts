// POST /api/v1/analyze: the engine as a stateless service, through the real route and auth.
import { beforeAll, describe, expect, it } from "vitest";
import * as analyze from "../../app/routes/api/analyze";
import type { SeriesAnalysis } from "../../app/lib/stats/analyze";
import { ANALYST } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";

let cookie: string;
beforeAll(async () => {
  cookie = await cookieFor(ANALYST);
});

const post = (body: string, headers: Record<string, string> = {}) =>
  run(analyze.action, request("/api/v1/analyze", { method: "POST", cookie, body, headers: { "Content-Type": "application/json", ...headers } }));

describe("POST /api/v1/analyze", () => {
  it("answers limits, points, signals, trend and forecast for a drifting series", async () => {
    // 20 stable points around 0, then a steady climb: a baseline, then points that break the rules.
    const stable = [0.1, -0.2, 0.05, 0.15, -0.1, 0, 0.2, -0.15, 0.1, -0.05, 0.12, -0.08, 0.02, 0.18, -0.12, 0.06, -0.02, 0.09, -0.11, 0.04];
    const drift = Array.from({ length: 12 }, (_, i) => 0.3 + 0.1 * i);
    const values = [...stable, ...drift];
    const times = values.map((_, i) => new Date(Date.UTC(2026, 0, 5 + i, 8)).toISOString());
    const result = await post(JSON.stringify({ values, times, tolerance: { upper: 2.5, lower: -2.5, guardBand: 0.5 } }));
    expect(result.status).toBe(200);
    const body = result.body as SeriesAnalysis;
    expect(body.n).toBe(values.length);
    expect(body.baseline).toMatchObject({ count: 20 });
    expect(body.limits!.ucl).toBeGreaterThan(body.baseline!.center);
    expect(body.points).toHaveLength(values.length);
    expect(body.points[0]).toEqual(expect.objectContaining({ index: 0, value: values[0], signals: expect.any(Array) }));
    expect(body.signals.map((s) => s.rule)).toContain("nelson-1");
    expect(body.trend!.per).toBe("day");
    expect(body.trend!.slope).toBeGreaterThan(0);
    expect(body).toHaveProperty("forecast");
    expect(body).toHaveProperty("warnings");
  });

  it.each([
    ["not JSON", "{values: [1, 2", 400, ""],
    ["values missing", JSON.stringify({ times: [] }), 422, "/values"],
    ["a value that is not a number", JSON.stringify({ values: [1, "two", 3] }), 422, "/values/1"],
    ["lengths that differ", JSON.stringify({ values: [1, 2, 3], times: ["2026-01-01T00:00:00Z"] }), 422, "/times"],
    ["an unknown rule id", JSON.stringify({ values: [1, 2, 3], rules: ["nelson-1", "nelson-99"] }), 422, "/rules"],
    ["λ outside (0, 1]", JSON.stringify({ values: [1, 2, 3], ewma: { lambda: 1.5, L: 3 } }), 422, "/ewma/lambda"],
  ])("refuses %s as problem+json naming the field", async (_case, body, status, pointer) => {
    const result = await post(body);
    expect(result.status).toBe(status);
    expect(result.headers.get("Content-Type")).toBe("application/problem+json");
    const problem = result.body as { errors: { pointer: string }[] };
    expect(problem.errors.map((e) => e.pointer).some((p) => p.startsWith(pointer))).toBe(true);
  });

  it("refuses a body over 5 MB with 413, not a 500", async () => {
    const big = JSON.stringify({ values: Array.from({ length: 600_000 }, (_, i) => i + 0.123456789) });
    const result = await post(big);
    expect(result.status).toBe(413);
    expect(result.headers.get("Content-Type")).toBe("application/problem+json");
  });

  it("needs a signed-in person or a token", async () => {
    const result = await run(analyze.action, request("/api/v1/analyze", { method: "POST", body: JSON.stringify({ values: [1] }) }));
    expect(result.status).toBe(401);
  });
});
