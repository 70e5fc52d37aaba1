import { Scratch } from "./scratch";
import { decimalGrid } from "./summary";

// Readings to the readability d take few distinct values: counting them beats comparing them (a merge sort's
// comparisons are coin flips to the branch predictor).
const scratch = new Scratch();

/** Values on a decimal grid as step codes 0…R − 1 (code order = value order, equal codes = equal values), counted per code. Valid until the next `gridCodes` call. */
export interface GridCodes {
  codes: Int32Array;
  /** The value of each code, NaN for codes no value takes. */
  levels: Float64Array;
  /** How many values take each code: the tie groups in ascending order. */
  counts: Int32Array;
}

/** Step codes of values on a decimal grid spanning at most max(64, 8n) steps; null when the values are off such a grid, or two different values share a step. */
export function gridCodes(values: ArrayLike<number>): GridCodes | null {
  const n = values.length;
  const p = decimalGrid(values);
  if (p === null || n === 0) return null;
  const scale = 10 ** p;
  // floor(x + 0.5) is monotone like Math.round and much cheaper here; codes only have to keep the order.
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < n; i++) {
    const code = Math.floor(values[i] * scale + 0.5);
    low = Math.min(low, code);
    high = Math.max(high, code);
  }
  const range = high - low + 1;
  if (!(range <= Math.max(64, 8 * n))) return null;
  const codes = scratch.int32(0, n);
  const levels = scratch.float64(0, range).fill(Number.NaN);
  const counts = scratch.int32(1, range).fill(0);
  for (let i = 0; i < n; i++) {
    const c = (codes[i] = Math.floor(values[i] * scale + 0.5) - low);
    counts[c]++;
    if (Number.isNaN(levels[c])) levels[c] = values[i];
    else if (levels[c] !== values[i]) return null;
  }
  return { codes, levels, counts };
}

/** Pairs i < j with codes[j] < codes[i] (ties are not inversions), by a Fenwick tree over the R codes in O(n log R). */
export function codeInversions({ codes, counts }: GridCodes): number {
  const range = counts.length;
  const tree = scratch.int32(2, range + 1).fill(0);
  let inversions = 0;
  for (let j = 0; j < codes.length; j++) {
    let atOrBelow = 0;
    for (let q = codes[j] + 1; q > 0; q -= q & -q) atOrBelow += tree[q];
    inversions += j - atOrBelow;
    for (let q = codes[j] + 1; q <= range; q += q & -q) tree[q]++;
  }
  return inversions;
}

/** Stable counting sort by code: `order` receives the indexes in sorted order, `sorted` the values. */
export function sortByCode({ codes, levels, counts }: GridCodes, order: Int32Array, sorted: Float64Array): void {
  const start = scratch.int32(2, counts.length);
  for (let c = 0, at = 0; c < counts.length; at += counts[c++]) start[c] = at;
  for (let i = 0; i < codes.length; i++) {
    const at = start[codes[i]]++;
    order[at] = i;
    sorted[at] = levels[codes[i]];
  }
}
