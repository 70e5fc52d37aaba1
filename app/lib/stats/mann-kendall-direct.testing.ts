// The Mann–Kendall statistic straight from its definition, for tests that check the fast paths against it.

/** S = Σᵢ<ⱼ sign(yⱼ − yᵢ) and Var(S) with the tie correction, from the definitions in O(n²). */
export function mannKendallDirect(values: number[]): { s: number; variance: number } {
  let s = 0;
  for (let i = 0; i < values.length; i++) for (let j = i + 1; j < values.length; j++) s += Math.sign(values[j] - values[i]);
  const counts = new Map<number, number>();
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
  let tie = 0;
  for (const t of counts.values()) tie += t * (t - 1) * (2 * t + 5);
  const n = values.length;
  return { s, variance: (n * (n - 1) * (2 * n + 5) - tie) / 18 };
}
