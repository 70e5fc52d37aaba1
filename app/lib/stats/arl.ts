import { normalCdf } from "./distributions";

export const DEFAULT_MARKOV_STATES = 200;

/** Solves (I − Q)·a = 1 for a square sub-stochastic Q (row-major, m × m) by Gaussian elimination with partial pivoting. */
function expectedStepsToAbsorption(transient: Float64Array, m: number): Float64Array {
  const a = new Float64Array(m * m);
  const b = new Float64Array(m).fill(1);
  for (let i = 0; i < m * m; i++) a[i] = -transient[i];
  for (let i = 0; i < m; i++) a[i * m + i] += 1;
  for (let col = 0; col < m; col++) {
    let pivot = col;
    for (let row = col + 1; row < m; row++) if (Math.abs(a[row * m + col]) > Math.abs(a[pivot * m + col])) pivot = row;
    if (pivot !== col) {
      for (let j = 0; j < m; j++) [a[col * m + j], a[pivot * m + j]] = [a[pivot * m + j], a[col * m + j]];
      [b[col], b[pivot]] = [b[pivot], b[col]];
    }
    const diagonal = a[col * m + col];
    for (let row = col + 1; row < m; row++) {
      const factor = a[row * m + col] / diagonal;
      if (factor === 0) continue;
      for (let j = col; j < m; j++) a[row * m + j] -= factor * a[col * m + j];
      b[row] -= factor * b[col];
    }
  }
  for (let row = m - 1; row >= 0; row--) {
    let total = b[row];
    for (let j = row + 1; j < m; j++) total -= a[row * m + j] * b[j];
    b[row] = total / a[row * m + row];
  }
  return b;
}

/** One-sided upper CUSUM ARL from C₀ = 0 (Brook & Evans 1972 chain, m states, k and h in σ, mean shift δσ); NaN for h ≤ 0. */
export function upperCusumArl(k: number, h: number, shift: number, states = DEFAULT_MARKOV_STATES): number {
  if (!(h > 0) || !(states >= 2)) return Number.NaN;
  const m = Math.floor(states);
  const width = (2 * h) / (2 * m - 1);
  // Entries depend on j − i only: Φ((j − i + ½)w + k − δ) on a lattice of 2m points.
  const edge = new Float64Array(2 * m);
  for (let t = 0; t < 2 * m; t++) edge[t] = normalCdf((t - m + 0.5) * width + k - shift);
  const q = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    q[i * m] = edge[m - i];
    for (let j = 1; j < m; j++) q[i * m + j] = edge[m + j - i] - edge[m + j - i - 1];
  }
  return expectedStepsToAbsorption(q, m)[0];
}

/** Two-sided tabular CUSUM ARL, 1/ARL = 1/ARL⁺(δ) + 1/ARL⁺(−δ) (exact for k ≥ 0 as the two sides cannot both be active); 465 for k = 0.5, h = 5, δ = 0. */
export function cusumArl(k: number, h: number, shift: number, states = DEFAULT_MARKOV_STATES): number {
  const upper = upperCusumArl(k, h, shift, states);
  const lower = upperCusumArl(k, h, -shift, states);
  return 1 / (1 / upper + 1 / lower);
}

/** EWMA ARL from z₀ = centre with asymptotic limits ±L√(λ/(2 − λ)) (Lucas & Saccucci 1990 chain, m states, shift δσ); NaN for λ ∉ (0, 1]. */
export function ewmaArl(lambda: number, L: number, shift: number, states = DEFAULT_MARKOV_STATES + 1): number {
  if (!(lambda > 0 && lambda <= 1) || !(L > 0)) return Number.NaN;
  const m = Math.floor(states / 2) * 2 + 1;
  const limit = L * Math.sqrt(lambda / (2 - lambda));
  const width = (2 * limit) / m;
  const q = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    const from = (1 - lambda) * (-limit + (i + 0.5) * width);
    let below = normalCdf((-limit - from) / lambda - shift);
    for (let j = 0; j < m; j++) {
      const upTo = normalCdf((-limit + (j + 1) * width - from) / lambda - shift);
      q[i * m + j] = upTo - below;
      below = upTo;
    }
  }
  return expectedStepsToAbsorption(q, m)[(m - 1) / 2];
}

/** Bisection for the root of an increasing function on [low, high] to the given tolerance; NaN when the bracket holds no root. */
function bisectIncreasing(f: (x: number) => number, low: number, high: number, tolerance: number): number {
  if (!(f(low) <= 0 && f(high) >= 0)) return Number.NaN;
  while (high - low > tolerance) {
    const middle = (low + high) / 2;
    if (f(middle) < 0) low = middle;
    else high = middle;
  }
  return (low + high) / 2;
}

/** Decision interval h (in σ) whose two-sided in-control CUSUM ARL equals the target, by bisection on h ∈ [0.1, 20] to 1e−4; NaN if out of range. */
export function cusumDecisionIntervalForArl(k: number, targetArl: number, states = DEFAULT_MARKOV_STATES): number {
  return bisectIncreasing((h) => cusumArl(k, h, 0, states) - targetArl, 0.1, 20, 1e-4);
}

/** Limit multiple L whose in-control EWMA ARL equals the target, by bisection on L ∈ [0.5, 6] to 1e−4; NaN if out of range. */
export function ewmaLimitForArl(lambda: number, targetArl: number, states = DEFAULT_MARKOV_STATES + 1): number {
  return bisectIncreasing((L) => ewmaArl(lambda, L, 0, states) - targetArl, 0.5, 6, 1e-4);
}
