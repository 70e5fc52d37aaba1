export interface CusumOptions {
  /** Reference value in σ̂ (slack). */
  k: number;
  /** Decision interval in σ̂. */
  h: number;
}

export const DEFAULT_CUSUM: CusumOptions = { k: 0.5, h: 5 };

export interface CusumResult {
  high: Float64Array;
  low: Float64Array;
  /** 1 where C⁺ > hσ̂. */
  signalHigh: Int8Array;
  /** 1 where C⁻ > hσ̂. */
  signalLow: Int8Array;
}

/** Tabular CUSUM C⁺ᵢ = max(0, xᵢ − (centre + kσ̂) + C⁺ᵢ₋₁), C⁻ᵢ = max(0, (centre − kσ̂) − xᵢ + C⁻ᵢ₋₁), C₀ = 0, in the units of x; signal when C > hσ̂ (strict); sums are not reset after a signal; empty input gives empty arrays. */
export function tabularCusum(
  values: ArrayLike<number>,
  center: number,
  sigma: number,
  options: CusumOptions = DEFAULT_CUSUM,
): CusumResult {
  const n = values.length;
  const high = new Float64Array(n);
  const low = new Float64Array(n);
  const signalHigh = new Int8Array(n);
  const signalLow = new Int8Array(n);
  const upperReference = center + options.k * sigma;
  const lowerReference = center - options.k * sigma;
  const decision = options.h * sigma;
  let upper = 0;
  let lower = 0;
  for (let i = 0; i < n; i++) {
    upper = Math.max(0, values[i] - upperReference + upper);
    lower = Math.max(0, lowerReference - values[i] + lower);
    high[i] = upper;
    low[i] = lower;
    signalHigh[i] = upper > decision ? 1 : 0;
    signalLow[i] = lower > decision ? 1 : 0;
  }
  return { high, low, signalHigh, signalLow };
}
