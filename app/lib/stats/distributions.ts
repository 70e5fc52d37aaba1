import jStat from "jstat";

/** Standard normal CDF Φ(z) (jstat erfc); Φ(±∞) = 1/0; NaN in, NaN out. */
export function normalCdf(z: number): number {
  if (z === Infinity) return 1;
  if (z === -Infinity) return 0;
  return jStat.normal.cdf(z, 0, 1);
}

/** Standard normal quantile Φ⁻¹(p) for 0 < p < 1; ±Infinity at p = 1 / 0; NaN outside [0, 1]. */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return Number.NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  return jStat.normal.inv(p, 0, 1);
}

/** Student t CDF P(T ≤ t) with df > 0 degrees of freedom; NaN when df ≤ 0. */
export function studentTCdf(t: number, df: number): number {
  if (!(df > 0)) return Number.NaN;
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  return jStat.studentt.cdf(t, df);
}

/** Student t quantile t(p; df) for 0 < p < 1, df > 0 (accurate to about 1e-9); NaN otherwise. */
export function studentTQuantile(p: number, df: number): number {
  if (!(df > 0) || !(p > 0 && p < 1)) return Number.NaN;
  return jStat.studentt.inv(p, df);
}

/** Two-sided p-value 2·(1 − F_t(|t|; df)) of a t statistic; 1 for t = 0, 0 for |t| = ∞, NaN when df ≤ 0. */
export function twoSidedTPValue(t: number, df: number): number {
  if (Number.isNaN(t) || !(df > 0)) return Number.NaN;
  if (t === 0) return 1;
  return Math.min(1, 2 * studentTCdf(-Math.abs(t), df));
}

/** ln Γ(x) for x > 0 (jstat). */
export function logGamma(x: number): number {
  return jStat.gammaln(x);
}
