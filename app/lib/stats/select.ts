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
