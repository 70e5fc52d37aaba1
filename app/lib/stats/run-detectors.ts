// Detectors behind the run rules: one O(n) pass each, over values already in time order.
// Per point: 0 = quiet, 1 = fires above or rising, −1 = below or falling, 2 = fires without a side.

/** Fires at i (1 above, −1 below) when the `window` points ending at i hold ≥ `count` strictly beyond one threshold and i is one of them; incomplete windows never fire. */
export function kOfWindow(values: ArrayLike<number>, upper: number, lower: number, count: number, window: number): Int8Array {
  const n = values.length;
  const firing = new Int8Array(n);
  const above = new Uint8Array(n);
  const below = new Uint8Array(n);
  let inAbove = 0;
  let inBelow = 0;
  for (let i = 0; i < n; i++) {
    above[i] = values[i] > upper ? 1 : 0;
    below[i] = values[i] < lower ? 1 : 0;
    inAbove += above[i];
    inBelow += below[i];
    if (i >= window) {
      inAbove -= above[i - window];
      inBelow -= below[i - window];
    }
    if (i < window - 1) continue;
    if (above[i] && inAbove >= count) firing[i] = 1;
    else if (below[i] && inBelow >= count) firing[i] = -1;
  }
  return firing;
}

/** Fires at i (1 rising, −1 falling) when the `run` points ending at i each rise (or each fall) strictly from the one before; a tie breaks the run. */
export function steadyTrend(values: ArrayLike<number>, run: number): Int8Array {
  const firing = new Int8Array(values.length);
  let rises = 0;
  let falls = 0;
  for (let i = 1; i < values.length; i++) {
    const step = values[i] - values[i - 1];
    rises = step > 0 ? rises + 1 : 0;
    falls = step < 0 ? falls + 1 : 0;
    if (rises >= run - 1) firing[i] = 1;
    else if (falls >= run - 1) firing[i] = -1;
  }
  return firing;
}

/** Fires at i (2) when the `run` points ending at i have `run` − 1 non-zero differences alternating in sign; a zero difference breaks it. */
export function alternating(values: ArrayLike<number>, run: number): Int8Array {
  const firing = new Int8Array(values.length);
  let streak = 0;
  let previousStep = 0;
  for (let i = 1; i < values.length; i++) {
    const step = Math.sign(values[i] - values[i - 1]);
    if (step === 0) streak = 0;
    else streak = previousStep !== 0 && step !== previousStep ? streak + 1 : 1;
    previousStep = step;
    if (streak >= run - 1) firing[i] = 2;
  }
  return firing;
}

/** Fires at i (2) when the `run` points ending at i all lie strictly between lower and upper. */
export function withinRun(values: ArrayLike<number>, lower: number, upper: number, run: number): Int8Array {
  const firing = new Int8Array(values.length);
  let streak = 0;
  for (let i = 0; i < values.length; i++) {
    streak = values[i] > lower && values[i] < upper ? streak + 1 : 0;
    if (streak >= run) firing[i] = 2;
  }
  return firing;
}

/** Fires at i (2) when the `run` points ending at i all lie strictly outside (lower, upper), with at least one above and one below. */
export function bothSidesRun(values: ArrayLike<number>, lower: number, upper: number, run: number): Int8Array {
  const firing = new Int8Array(values.length);
  let streak = 0;
  let lastAbove = -Infinity;
  let lastBelow = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const x = values[i];
    if (x > upper) lastAbove = i;
    if (x < lower) lastBelow = i;
    streak = x > upper || x < lower ? streak + 1 : 0;
    if (streak >= run && lastAbove > i - run && lastBelow > i - run) firing[i] = 2;
  }
  return firing;
}
