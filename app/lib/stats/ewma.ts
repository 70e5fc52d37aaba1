export interface EwmaOptions {
  lambda: number;
  L: number;
}

export const DEFAULT_EWMA: EwmaOptions = { lambda: 0.2, L: 3 };

export interface EwmaResult {
  z: Float64Array;
  ucl: Float64Array;
  lcl: Float64Array;
  /** 1 above the upper limit, −1 below the lower one, 0 inside. */
  signal: Int8Array;
}

/** EWMA zᵢ = λxᵢ + (1 − λ)zᵢ₋₁, z₀ = centre, exact limits centre ± Lσ̂√(λ/(2 − λ)·(1 − (1 − λ)^2i)); signal when z is strictly beyond a limit; empty input gives empty arrays; λ = 1 is the Shewhart chart. */
export function ewmaChart(
  values: ArrayLike<number>,
  center: number,
  sigma: number,
  options: EwmaOptions = DEFAULT_EWMA,
): EwmaResult {
  const { lambda, L } = options;
  const n = values.length;
  const z = new Float64Array(n);
  const ucl = new Float64Array(n);
  const lcl = new Float64Array(n);
  const signal = new Int8Array(n);
  const asymptoticHalfWidth = L * sigma * Math.sqrt(lambda / (2 - lambda));
  const decaySquared = (1 - lambda) * (1 - lambda);
  let previous = center;
  let decayPower = 1;
  for (let i = 0; i < n; i++) {
    previous = lambda * values[i] + (1 - lambda) * previous;
    decayPower *= decaySquared;
    // Once (1 − λ)^2i is below half an ulp of 1 the factor is exactly √1 = 1: skip the square root.
    const factor = 1 - decayPower;
    const halfWidth = factor === 1 ? asymptoticHalfWidth : asymptoticHalfWidth * Math.sqrt(factor);
    z[i] = previous;
    ucl[i] = center + halfWidth;
    lcl[i] = center - halfWidth;
    signal[i] = previous > ucl[i] ? 1 : previous < lcl[i] ? -1 : 0;
  }
  return { z, ucl, lcl, signal };
}

/** Asymptotic EWMA limits centre ± Lσ̂√(λ/(2 − λ)), the values the exact limits approach. */
export function ewmaAsymptoticLimits(center: number, sigma: number, options: EwmaOptions = DEFAULT_EWMA): { ucl: number; lcl: number } {
  const halfWidth = options.L * sigma * Math.sqrt(options.lambda / (2 - options.lambda));
  return { ucl: center + halfWidth, lcl: center - halfWidth };
}
