import { existsSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { cusumArl, cusumDecisionIntervalForArl, ewmaArl, ewmaLimitForArl, upperCusumArl } from "./arl";

/** |x − published| within half a unit of the published value's last digit. */
function toPublishedRounding(value: number, published: string): void {
  const decimals = published.split(".")[1]?.length ?? 0;
  expect(Math.abs(value - Number(published))).toBeLessThanOrEqual(0.5 * 10 ** -decimals);
}

// Montgomery, Introduction to SQC ch. 9, ARLs of the two-sided tabular CUSUM with k = 1/2 (S): REFERENCE.md §5.
describe("tabular CUSUM ARL by Markov chain (Brook & Evans discretisation, 200 states)", () => {
  it.each([
    { h: 5, shift: 0, published: "465" },
    { h: 5, shift: 1, published: "10.4" },
    { h: 4, shift: 1, published: "8.38" },
  ])("k = 0.5, h = $h, shift $shift σ → ARL $published", ({ h, shift, published }) => {
    toPublishedRounding(cusumArl(0.5, h, shift), published);
  });
  it("two-sided in-control ARL is half the one-sided one (symmetric chart)", () => {
    expect(cusumArl(0.5, 5, 0)).toBeCloseTo(upperCusumArl(0.5, 5, 0) / 2, 8);
  });
  it("inverse: the h giving ARL₀ = 465 is 5 (to 0.01)", () => {
    expect(cusumDecisionIntervalForArl(0.5, 465)).toBeCloseTo(5, 2);
  });
  it("h ≤ 0 gives NaN", () => expect(upperCusumArl(0.5, 0, 0)).toBeNaN());
});

// EWMA ARLs of Montgomery's ch. 9 EWMA table (from memory, M; typed in notebooks-free-data/montgomery-ewma-arl/).
const ewmaTable = fileURLToPath(new URL("../../../notebooks-free-data/montgomery-ewma-arl/ewma-arl.csv", import.meta.url));
describe.skipIf(!existsSync(ewmaTable))("EWMA ARL by Markov chain (Lucas & Saccucci style, 201 states), values from memory (M)", () => {
  const rows = existsSync(ewmaTable)
    ? readFileSync(ewmaTable, "utf8").split("\n").filter((l) => l && !l.startsWith("#")).slice(1).map((l) => l.split(","))
    : [];
  it.each(rows.map(([lambda, L, shift, arl]) => ({ lambda: Number(lambda), L: Number(L), shift: Number(shift), arl })))(
    "λ = $lambda, L = $L, shift $shift σ → ARL $arl (within 1 % or the last digit)",
    ({ lambda, L, shift, arl }) => {
      const computed = ewmaArl(lambda, L, shift);
      const decimals = arl.split(".")[1]?.length ?? 0;
      expect(Math.abs(computed - Number(arl))).toBeLessThanOrEqual(Math.max(0.01 * Number(arl), 0.5 * 10 ** -decimals));
    },
  );
  it("inverse: λ = 0.1 needs L ≈ 2.814 for ARL₀ = 500 (M)", () => {
    expect(ewmaLimitForArl(0.1, 500)).toBeCloseTo(2.814, 2);
  });
});

describe("ARL edge cases", () => {
  it("λ outside (0, 1] gives NaN", () => {
    expect(ewmaArl(0, 3, 0)).toBeNaN();
    expect(ewmaArl(1.2, 3, 0)).toBeNaN();
  });
  it("λ = 1 is the Shewhart chart: ARL₀ ≈ 370.4 (REFERENCE.md §5)", () => {
    expect(ewmaArl(1, 3, 0)).toBeCloseTo(370.4, 0);
  });
});
