/** mulberry32: a small seeded PRNG, so the demo data is the same on every machine. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate by Box–Muller from a seeded uniform source. */
export function normal(random: () => number): number {
  const u = 1 - random();
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

export const SEED = 20261130;
/** The demo's "today": every date in the scenario is relative to it. */
export const REFERENCE_DATE = new Date("2026-11-30T12:00:00Z");
