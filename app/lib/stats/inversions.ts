const BLOCK = 16;

let shared: InversionCounter | null = null;

/** A counter for series of up to n points, reused between calls (buffers are scratch space, so results never depend on it). */
export function inversionCounter(n: number): InversionCounter {
  if (shared === null || shared.capacity < n) shared = new InversionCounter(Math.max(n, 2 * (shared?.capacity ?? 0)));
  return shared;
}

/** Reusable buffers for `sortCountingInversions`, sized for series of up to `capacity` points. */
export class InversionCounter {
  private keysA: Float64Array;
  private keysB: Float64Array;
  private indexA: Int32Array;
  private indexB: Int32Array;
  private sorted: Float64Array;

  constructor(readonly capacity: number) {
    this.keysA = new Float64Array(capacity);
    this.keysB = new Float64Array(capacity);
    this.indexA = new Int32Array(capacity);
    this.indexB = new Int32Array(capacity);
    this.sorted = this.keysA;
  }

  /** The keys of the last `sortCountingInversions` call in ascending order (a view of scratch space, valid until the next call). */
  sortedKeys(n: number): Float64Array {
    return this.sorted.subarray(0, n);
  }

  /** Number of pairs i < j with keys[j] < keys[i] (strict; ties are not inversions), by a stable bottom-up merge sort in O(n log n); when `order` is given it receives the indexes in sorted order. 0 for n < 2. */
  sortCountingInversions(keys: ArrayLike<number>, n: number, order?: Int32Array): number {
    let keysFrom = this.keysA;
    let keysTo = this.keysB;
    let indexFrom = this.indexA;
    let indexTo = this.indexB;
    for (let i = 0; i < n; i++) {
      keysFrom[i] = keys[i];
      indexFrom[i] = i;
    }
    let inversions = 0;
    // Insertion sort of short blocks first: merging from width 1 costs twice as much.
    for (let start = 0; start < n; start += BLOCK) {
      const end = Math.min(start + BLOCK, n);
      for (let i = start + 1; i < end; i++) {
        const key = keysFrom[i];
        const index = indexFrom[i];
        let p = i - 1;
        for (; p >= start && keysFrom[p] > key; p--) {
          keysFrom[p + 1] = keysFrom[p];
          indexFrom[p + 1] = indexFrom[p];
        }
        inversions += i - 1 - p;
        keysFrom[p + 1] = key;
        indexFrom[p + 1] = index;
      }
    }
    for (let width = BLOCK; width < n; width *= 2) {
      for (let start = 0; start < n; start += 2 * width) {
        const middle = Math.min(start + width, n);
        const end = Math.min(start + 2 * width, n);
        let left = start;
        let right = middle;
        let out = start;
        while (left < middle && right < end) {
          const leftKey = keysFrom[left];
          const rightKey = keysFrom[right];
          if (rightKey < leftKey) {
            inversions += middle - left;
            keysTo[out] = rightKey;
            indexTo[out++] = indexFrom[right++];
          } else {
            keysTo[out] = leftKey;
            indexTo[out++] = indexFrom[left++];
          }
        }
        while (left < middle) {
          keysTo[out] = keysFrom[left];
          indexTo[out++] = indexFrom[left++];
        }
        while (right < end) {
          keysTo[out] = keysFrom[right];
          indexTo[out++] = indexFrom[right++];
        }
      }
      const keysHeld = keysFrom;
      keysFrom = keysTo;
      keysTo = keysHeld;
      const indexHeld = indexFrom;
      indexFrom = indexTo;
      indexTo = indexHeld;
    }
    this.sorted = keysFrom;
    if (order) order.set(indexFrom.subarray(0, n));
    return inversions;
  }
}
