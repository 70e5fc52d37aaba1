// Checked against a full sort of the same numbers (C).
import { describe, expect, it } from "vitest";
import { medianInPlace, selectKth } from "./select";

describe("selectKth / medianInPlace", () => {
  it("every rank of a shuffled array with duplicates equals the sorted array", () => {
    let state = 5;
    const values = Array.from({ length: 257 }, () => Math.floor(((state = (state * 16807) % 2147483647) / 2147483647) * 40));
    const sorted = [...values].sort((a, b) => a - b);
    for (let k = 0; k < values.length; k++) expect(selectKth(Float64Array.from(values), k)).toBe(sorted[k]);
  });
  it.each([
    { values: [], median: NaN },
    { values: [3], median: 3 },
    { values: [4, 1], median: 2.5 },
    { values: [5, 1, 3], median: 3 },
    { values: [2, 2, 2, 9], median: 2 },
  ])("median of $values is $median", ({ values, median }) => {
    if (Number.isNaN(median)) expect(medianInPlace(Float64Array.from(values))).toBeNaN();
    else expect(medianInPlace(Float64Array.from(values))).toBe(median);
  });
  it("out-of-range rank gives NaN", () => expect(selectKth(Float64Array.from([1, 2]), 2)).toBeNaN());
});
