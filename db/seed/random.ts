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
/** The fixed "today" the tests are written against. */
export const REFERENCE_DATE = new Date("2026-11-30T12:00:00Z");

/**
 * The demo's "today": every date in the scenario is relative to it. TARELINE_DEMO_DATE moves it (`npm start` seeds
 * a fresh database as of the moment it runs, so the stories are current on first sight); otherwise the fixed date.
 * The random draws do not depend on it, so the stories are the same, only shifted in time.
 */
export function demoToday(): Date {
  const moved = process.env.TARELINE_DEMO_DATE;
  if (!moved) return REFERENCE_DATE;
  const at = new Date(moved);
  if (Number.isNaN(at.getTime())) throw new Error(`TARELINE_DEMO_DATE is not a date: ${moved}`);
  return at;
}
