import type { ControlLimits } from "./limits";
import type { RunRuleOptions } from "./run-rules";

/** The detectors behind the run rules; nelson-1 and we-1 share `beyondThree`, and so on. */
export type Detector = "beyondThree" | "nelsonSameSide" | "weSameSide" | "trend" | "alternating" | "twoOfThree" | "fourOfFive" | "within" | "bothSides";

/** Per point: 0 = quiet, 1 = fires above or rising, −1 = below or falling, 2 = fires without a side. */
export type Firings = Partial<Record<Detector, Int8Array>>;

/**
 * All wanted detectors in one pass over values in time order, per DESIGN §3: strict inequalities, a point on the
 * centre line breaks a same-side run, a tie breaks a rising or falling run, "k of m" windows only when complete and
 * only when point i is one of the k. Counters are kept with arithmetic instead of branches (in-control data makes
 * every zone test a coin flip, which a branch predictor cannot follow), and inline: no helper calls, which cost much
 * while the code still runs in the interpreter, before the compiler has seen it hot.
 */
export function runRulePass(values: ArrayLike<number>, limits: ControlLimits, wanted: ReadonlySet<Detector>, options: RunRuleOptions): Firings {
  const n = values.length;
  const firings: Firings = {};
  for (const detector of wanted) firings[detector] = new Int8Array(n);
  const { beyondThree, nelsonSameSide, weSameSide, trend, alternating, twoOfThree, fourOfFive, within, bothSides } = firings;
  const { center, ucl, lcl, uwl, lwl, upperOneSigma: upper1, lowerOneSigma: lower1 } = limits;
  // Every length a local: the loop then reads no object field.
  const { count: twoCount, window: twoWindow } = options.beyondTwoSigma;
  const { count: oneCount, window: oneWindow } = options.beyondOneSigma;
  const { nelsonSameSideRun, westernElectricSameSideRun, withinOneSigmaRun, bothSidesRun } = options;
  const trendSteps = options.trendRun - 1;
  const alternatingSteps = options.alternatingRun - 1;
  let above = 0; // points in a row strictly above the centre line
  let below = 0;
  let rises = 0;
  let falls = 0;
  let swings = 0; // differences in a row alternating in sign
  let previousStep = 0;
  let twoAbove = 0; // points beyond 2σ above in the window of `twoWindow` points ending at i
  let twoBelow = 0;
  let oneAbove = 0;
  let oneBelow = 0;
  let inside = 0; // points in a row strictly within 1σ
  let outside = 0; // points in a row strictly beyond 1σ
  // Index of the last point beyond 1σ above (below); small integers keep every counter an unboxed int32.
  let lastAbove = -(2 ** 29);
  let lastBelow = -(2 ** 29);
  for (let i = 0; i < n; i++) {
    const x = values[i];
    const a1 = +(x > upper1);
    const b1 = +(x < lower1);
    const a2 = +(x > uwl);
    const b2 = +(x < lwl);
    above = (above + 1) * +(x > center);
    below = (below + 1) * +(x < center);
    if (i > 0) {
      const step = Math.sign(x - values[i - 1]);
      rises = (rises + 1) * +(step > 0);
      falls = (falls + 1) * +(step < 0);
      // As the definition reads: a zero difference ends the run; one equal to the previous restarts it at 1.
      swings = +(step !== 0) * (+(previousStep !== 0) * +(step !== previousStep) * swings + 1);
      previousStep = step;
    }
    twoAbove += a2 - (i >= twoWindow ? +(values[i - twoWindow] > uwl) : 0);
    twoBelow += b2 - (i >= twoWindow ? +(values[i - twoWindow] < lwl) : 0);
    oneAbove += a1 - (i >= oneWindow ? +(values[i - oneWindow] > upper1) : 0);
    oneBelow += b1 - (i >= oneWindow ? +(values[i - oneWindow] < lower1) : 0);
    inside = (inside + 1) * +(x > lower1 && x < upper1);
    outside = (outside + 1) * +(x > upper1 || x < lower1);
    lastAbove += a1 * (i - lastAbove);
    lastBelow += b1 * (i - lastBelow);
    // Sided results: up − down·(1 − up) is 1 when the upper condition holds, else −1 when the lower one does, else 0.
    if (beyondThree) {
      const up = +(x > ucl);
      beyondThree[i] = up - +(x < lcl) * (1 - up);
    }
    if (nelsonSameSide) {
      const up = +(above >= nelsonSameSideRun);
      nelsonSameSide[i] = up - +(below >= nelsonSameSideRun) * (1 - up);
    }
    if (weSameSide) {
      const up = +(above >= westernElectricSameSideRun);
      weSameSide[i] = up - +(below >= westernElectricSameSideRun) * (1 - up);
    }
    if (trend && i > 0) {
      const up = +(rises >= trendSteps);
      trend[i] = up - +(falls >= trendSteps) * (1 - up);
    }
    if (alternating && i > 0) alternating[i] = 2 * +(swings >= alternatingSteps);
    if (twoOfThree && i >= twoWindow - 1) {
      const up = a2 * +(twoAbove >= twoCount);
      twoOfThree[i] = up - b2 * +(twoBelow >= twoCount) * (1 - up);
    }
    if (fourOfFive && i >= oneWindow - 1) {
      const up = a1 * +(oneAbove >= oneCount);
      fourOfFive[i] = up - b1 * +(oneBelow >= oneCount) * (1 - up);
    }
    if (within) within[i] = 2 * +(inside >= withinOneSigmaRun);
    if (bothSides) bothSides[i] = 2 * +(outside >= bothSidesRun && lastAbove > i - bothSidesRun && lastBelow > i - bothSidesRun);
  }
  return firings;
}
