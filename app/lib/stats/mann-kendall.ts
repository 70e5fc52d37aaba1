import { normalCdf } from "./distributions";
import { codeInversions, gridCodes } from "./grid-sort";
import { inversionCounter } from "./inversions";

export interface MannKendallResult {
  /** S = Σᵢ<ⱼ sign(yⱼ − yᵢ). */
  s: number;
  /** Var(S) = [n(n − 1)(2n + 5) − Σt(t − 1)(2t + 5)]/18 over groups of t tied values. */
  variance: number;
  /** (S − sign S)/√Var(S), with continuity correction. */
  z: number;
  /** Two-sided p-value 2(1 − Φ(|z|)). */
  pValue: number;
}

/** Mann–Kendall trend test on values in time order, normal approximation with tie correction, in O(n log n); n < 2 or all values tied gives S = 0, z = 0, p = 1. */
export function mannKendall(values: ArrayLike<number>): MannKendallResult {
  const n = values.length;
  if (n < 2) return { s: 0, variance: 0, z: 0, pValue: 1 };
  const grid = gridCodes(values);
  if (grid) return mannKendallFromTies(n, codeInversions(grid), grid.counts);
  const counter = inversionCounter(n);
  const discordant = counter.sortCountingInversions(values, n);
  const sorted = counter.sortedKeys(n);
  const ties: number[] = [];
  for (let start = 0, end = 0; start < n; start = end) {
    while (end < n && sorted[end] === sorted[start]) end++;
    ties.push(end - start);
  }
  return mannKendallFromTies(n, discordant, ties);
}

/** The same test from the discordant pairs D (inversions of the values in time order) and the sizes t of the tie groups (ascending values; groups of 0 are skipped): S = C − D with C = n(n − 1)/2 − D − Σt(t − 1)/2; n < 2 or all tied gives S = 0, z = 0, p = 1. */
export function mannKendallFromTies(n: number, discordant: number, ties: ArrayLike<number>): MannKendallResult {
  if (n < 2) return { s: 0, variance: 0, z: 0, pValue: 1 };
  let tiedPairs = 0;
  let tieTerm = 0;
  for (let g = 0; g < ties.length; g++) {
    const t = ties[g];
    tiedPairs += (t * (t - 1)) / 2;
    tieTerm += t * (t - 1) * (2 * t + 5);
  }
  const concordant = (n * (n - 1)) / 2 - discordant - tiedPairs;
  const s = concordant - discordant;
  const variance = (n * (n - 1) * (2 * n + 5) - tieTerm) / 18;
  if (!(variance > 0)) return { s, variance: 0, z: 0, pValue: 1 };
  const z = (s - Math.sign(s)) / Math.sqrt(variance);
  return { s, variance, z, pValue: Math.min(1, 2 * normalCdf(-Math.abs(z))) };
}
