import { logGamma, normalCdf } from "./distributions";

/** d2 for moving ranges of two, rounded as published (Montgomery App. VI) and as DESIGN §3 fixes it. */
export const D2_INDIVIDUALS = 1.128;

export interface ControlChartConstants {
  n: number;
  d2: number;
  d3: number;
  c4: number;
  A2: number;
  A3: number;
  B3: number;
  B4: number;
  D3: number;
  D4: number;
}

const STEP = 0.025;
const X_MIN = -8;
const X_MAX = 8;
const R_MAX = 12;

/** Simpson weight (1, 4, 2, 4, …, 1) of node i of an m-node rule; m must be odd. */
function simpsonWeight(i: number, m: number): number {
  if (i === 0 || i === m - 1) return 1;
  return i % 2 === 1 ? 4 : 2;
}

/** d2(n) = E[R]/σ = ∫(1 − Φ(x)ⁿ − (1 − Φ(x))ⁿ)dx for the range R of n normal values (Simpson, error < 1e−8); NaN for n < 2. */
export function rangeMeanFactor(n: number): number {
  if (!(Number.isInteger(n) && n >= 2)) return Number.NaN;
  const m = Math.round((X_MAX - X_MIN) / STEP) + 1;
  let total = 0;
  for (let i = 0; i < m; i++) {
    const phi = normalCdf(X_MIN + i * STEP);
    total += simpsonWeight(i, m) * (1 - phi ** n - (1 - phi) ** n);
  }
  return (total * STEP) / 3;
}

/** d3(n) = sd(R)/σ from E[R²] = 2∫r·P(R > r)dr, P(R ≤ r) = n∫φ(x)(Φ(x + r) − Φ(x))ⁿ⁻¹dx (Simpson); NaN for n < 2. */
export function rangeSdFactor(n: number): number {
  if (!(Number.isInteger(n) && n >= 2)) return Number.NaN;
  const mx = Math.round((X_MAX - X_MIN) / STEP) + 1;
  const mr = Math.round(R_MAX / STEP) + 1;
  const phiGrid = new Float64Array(mx + mr);
  for (let i = 0; i < phiGrid.length; i++) phiGrid[i] = normalCdf(X_MIN + i * STEP);
  const density = new Float64Array(mx);
  for (let i = 0; i < mx; i++) {
    const x = X_MIN + i * STEP;
    density[i] = Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
  }
  let secondMoment = 0;
  for (let j = 0; j < mr; j++) {
    let inner = 0;
    for (let i = 0; i < mx; i++) {
      inner += simpsonWeight(i, mx) * density[i] * (phiGrid[i + j] - phiGrid[i]) ** (n - 1);
    }
    const exceed = 1 - (n * inner * STEP) / 3;
    secondMoment += simpsonWeight(j, mr) * j * STEP * exceed;
  }
  secondMoment = (2 * secondMoment * STEP) / 3;
  const d2 = rangeMeanFactor(n);
  return Math.sqrt(secondMoment - d2 * d2);
}

/** c4(n) = √(2/(n − 1))·Γ(n/2)/Γ((n − 1)/2), so E[s] = c4·σ; NaN for n < 2. */
export function c4Factor(n: number): number {
  if (!(Number.isInteger(n) && n >= 2)) return Number.NaN;
  return Math.sqrt(2 / (n - 1)) * Math.exp(logGamma(n / 2) - logGamma((n - 1) / 2));
}

/** Exact factors for X̄/R/s charts of subgroup size n (A2 = 3/(d2√n), B3,4 = 1 ∓ 3√(1 − c4²)/c4, D3,4 = 1 ∓ 3d3/d2, lower ones floored at 0). */
export function controlChartConstants(n: number): ControlChartConstants {
  const d2 = rangeMeanFactor(n);
  const d3 = rangeSdFactor(n);
  const c4 = c4Factor(n);
  const sSpread = (3 * Math.sqrt(1 - c4 * c4)) / c4;
  return {
    n,
    d2,
    d3,
    c4,
    A2: 3 / (d2 * Math.sqrt(n)),
    A3: 3 / (c4 * Math.sqrt(n)),
    B3: Math.max(0, 1 - sSpread),
    B4: 1 + sSpread,
    D3: Math.max(0, 1 - (3 * d3) / d2),
    D4: 1 + (3 * d3) / d2,
  };
}

/** Shewhart ARL = 1/P(|Z + δ| > L) for a mean shift of δσ and limits ±Lσ (default 3): 370.4 in control. */
export function shewhartArl(shift: number, L = 3): number {
  const signalProbability = 1 - normalCdf(L - shift) + normalCdf(-L - shift);
  return 1 / signalProbability;
}
