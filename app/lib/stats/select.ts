import { Scratch } from "./scratch";

/** k-th smallest (0-based) of values[0..length) by in-place quickselect (Hoare partition, median-of-three); NaN when k is out of range. */
export function selectKth(values: Float64Array, k: number, length = values.length): number {
  if (!(k >= 0 && k < length)) return Number.NaN;
  let low = 0;
  let high = length - 1;
  while (high > low) {
    const middle = (low + high) >>> 1;
    if (values[middle] < values[low]) swap(values, middle, low);
    if (values[high] < values[low]) swap(values, high, low);
    if (values[high] < values[middle]) swap(values, high, middle);
    const pivot = values[middle];
    let i = low;
    let j = high;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) swap(values, i++, j--);
    }
    if (k <= j) high = j;
    else if (k >= i) low = i;
    else return values[k];
  }
  return values[k];
}

/** Median of values[0..length): the middle value, or the mean of the two middle values for an even count; NaN for none. Reorders the array. */
export function medianInPlace(values: Float64Array, length = values.length): number {
  if (length === 0) return Number.NaN;
  const upper = selectKth(values, length >> 1, length);
  if (length % 2 === 1) return upper;
  let lower = -Infinity;
  for (let i = 0; i < length >> 1; i++) if (values[i] > lower) lower = values[i];
  return (lower + upper) / 2;
}

function swap(values: Float64Array, a: number, b: number): void {
  const held = values[a];
  values[a] = values[b];
  values[b] = held;
}

const BUCKETS = 1024;
const scratch = new Scratch();

/** The k-th and (k + 1)-th smallest (0-based; the second NaN past the end) of values[0..length), by counting into 1 024 equal-width buckets between the minimum and the maximum, then selecting within the one bucket that holds rank k; may reorder the values. */
export function selectPairByBuckets(values: Float64Array, k: number, length = values.length): [number, number] {
  if (!(k >= 0 && k < length)) return [Number.NaN, Number.NaN];
  // One loop per function: code compiled while a loop runs never meets the loops after it without type feedback.
  const [low, high] = extent(values, length);
  const scale = BUCKETS / (high - low);
  if (length < 4 * BUCKETS || !Number.isFinite(scale)) return selectPairInPlace(values.subarray(0, length), k);
  const counts = histogram(values, length, low, scale);
  let bucket = 0;
  let before = 0;
  while (before + counts[bucket] <= k) before += counts[bucket++];
  const inBucket = scratch.float64(0, counts[bucket]);
  const next = gather(values, length, low, scale, bucket, inBucket);
  const [a, b] = selectPairInPlace(inBucket, k - before);
  return [a, Number.isNaN(b) && k + 1 < length ? next : b];
}

function extent(values: Float64Array, length: number): [number, number] {
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < length; i++) {
    low = Math.min(low, values[i]);
    high = Math.max(high, values[i]);
  }
  return [low, high];
}

function histogram(values: Float64Array, length: number, low: number, scale: number): Int32Array {
  const counts = scratch.int32(0, BUCKETS).fill(0);
  for (let i = 0; i < length; i++) counts[Math.min(BUCKETS - 1, ((values[i] - low) * scale) | 0)]++;
  return counts;
}

/** Copies the values of one bucket into `into`; returns the smallest value of the later buckets (the next rank may sit there). */
function gather(values: Float64Array, length: number, low: number, scale: number, bucket: number, into: Float64Array): number {
  let size = 0;
  let next = Infinity;
  for (let i = 0; i < length; i++) {
    const b = Math.min(BUCKETS - 1, ((values[i] - low) * scale) | 0);
    if (b === bucket) into[size++] = values[i];
    else if (b > bucket && values[i] < next) next = values[i];
  }
  return next;
}

/** The k-th and (k + 1)-th smallest of values by quickselect (the second NaN past the end); reorders the array. */
function selectPairInPlace(values: Float64Array, k: number): [number, number] {
  const a = selectKth(values, k);
  let b = Infinity;
  for (let i = k + 1; i < values.length; i++) if (values[i] < b) b = values[i];
  return [a, k + 1 < values.length ? b : Number.NaN];
}
