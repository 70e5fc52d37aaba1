/**
 * Reusable typed arrays for one module's temporaries, so that a fleet of analyses does not allocate (and collect)
 * dozens of buffers per series. Plain scratch space: callers write every entry before reading it, so results never
 * depend on it, and nothing a caller keeps may live in it.
 */
export class Scratch {
  private readonly floats: Float64Array[] = [];
  private readonly ints: Int32Array[] = [];

  /** A Float64Array of length n in slot `slot`, contents unspecified. */
  float64(slot: number, n: number): Float64Array {
    const held = this.floats[slot];
    if (held === undefined || held.length < n) this.floats[slot] = new Float64Array(Math.max(n, 2 * (held?.length ?? 0)));
    return this.floats[slot].subarray(0, n);
  }

  /** An Int32Array of length n in slot `slot`, contents unspecified. */
  int32(slot: number, n: number): Int32Array {
    const held = this.ints[slot];
    if (held === undefined || held.length < n) this.ints[slot] = new Int32Array(Math.max(n, 2 * (held?.length ?? 0)));
    return this.ints[slot].subarray(0, n);
  }
}
