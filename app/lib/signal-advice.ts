// Each statistical signal in words, with what to do next. Advice is common practice for routine balance checks;
// the site's quality system decides.
const ADVICE = {
  outlier: "Repeat the check. If the result repeats, look for a cause: the test weight and its handling, draughts, temperature, static, levelling.",
  shift: "The mean has shifted or is drifting. Check the levelling, the draught shield and the room temperature, then repeat the check; if it persists, ask for an adjustment or calibration.",
  cluster: "Results are gathering far from the centre. Repeat the check soon and look at the environment and the weight.",
  alternating: "Results alternate up and down. Look for two operators, two weights or a periodic disturbance.",
  hugging: "Results sit unusually close to the centre line. The limits may be too wide for this instrument: review the baseline.",
  mixture: "Results avoid the centre on both sides. Two populations may be mixed (operators, weights, positions).",
} as const;

const SIGNALS: Record<string, { name: string; advice: keyof typeof ADVICE }> = {
  "nelson-1": { name: "A point beyond the control limits (±3σ̂)", advice: "outlier" },
  "we-1": { name: "A point beyond the control limits (±3σ̂)", advice: "outlier" },
  "nelson-2": { name: "Nine points in a row on one side of the centre line", advice: "shift" },
  "we-4": { name: "Eight points in a row on one side of the centre line", advice: "shift" },
  "nelson-3": { name: "Six points in a row steadily rising or falling", advice: "shift" },
  "nelson-4": { name: "Fourteen points in a row alternating up and down", advice: "alternating" },
  "nelson-5": { name: "Two of three points beyond the warning limits (±2σ̂), same side", advice: "cluster" },
  "we-2": { name: "Two of three points beyond the warning limits (±2σ̂), same side", advice: "cluster" },
  "nelson-6": { name: "Four of five points beyond ±1σ̂, same side", advice: "cluster" },
  "we-3": { name: "Four of five points beyond ±1σ̂, same side", advice: "cluster" },
  "nelson-7": { name: "Fifteen points in a row within ±1σ̂", advice: "hugging" },
  "nelson-8": { name: "Eight points in a row outside ±1σ̂ on both sides", advice: "mixture" },
  ewma: { name: "The EWMA left its limits: a small sustained shift", advice: "shift" },
  "cusum-high": { name: "The upper CUSUM passed its decision interval: the mean has moved up", advice: "shift" },
  "cusum-low": { name: "The lower CUSUM passed its decision interval: the mean has moved down", advice: "shift" },
};

export function describeSignal(rule: string): { name: string; advice: string } {
  const known = SIGNALS[rule];
  return known ? { name: known.name, advice: ADVICE[known.advice] } : { name: rule, advice: ADVICE.outlier };
}
