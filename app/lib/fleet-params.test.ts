import { describe, expect, it } from "vitest";
import { FLEET_PAGE_SIZE, fleetPage, FleetParamsSchema } from "./fleet-params";

describe("fleetPage", () => {
  const rows = Array.from({ length: 2 * FLEET_PAGE_SIZE + 7 }, (_, i) => i);

  it("cuts the sorted list into pages and says where it stands", () => {
    expect(fleetPage(rows, 1)).toMatchObject({ page: 1, pages: 3, total: rows.length });
    expect(fleetPage(rows, 3).rows).toEqual(rows.slice(2 * FLEET_PAGE_SIZE));
  });

  it("clamps a page past the end to the last one, and an empty list to one empty page", () => {
    expect(fleetPage(rows, 99).page).toBe(3);
    expect(fleetPage([], 1)).toEqual({ rows: [], page: 1, pages: 1, total: 0 });
  });

  it("reads a page number from the URL and falls back to the first page on nonsense", () => {
    expect(FleetParamsSchema.parse({ page: "2" }).page).toBe(2);
    expect(FleetParamsSchema.parse({ page: "-1" }).page).toBe(1);
    expect(FleetParamsSchema.parse({}).page).toBe(1);
  });
});
