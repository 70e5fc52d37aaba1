import { DEFAULT_RUN_RULE_OPTIONS, type RuleId, type RunRuleOptions } from "./run-rules";

/** Plain sentence for a firing rule; direction 1 = above/rising, −1 = below/falling, anything else = no side. */
export function describeRule(rule: RuleId, direction: number, options: RunRuleOptions = DEFAULT_RUN_RULE_OPTIONS): string {
  const side = direction < 0 ? "below" : "above";
  switch (rule) {
    case "we-1":
    case "nelson-1":
      return `1 point beyond 3σ ${side} the centre line`;
    case "we-4":
      return `${options.westernElectricSameSideRun} points in a row ${side} the centre line`;
    case "nelson-2":
      return `${options.nelsonSameSideRun} points in a row ${side} the centre line`;
    case "nelson-3":
      return `${options.trendRun} points in a row steadily ${direction < 0 ? "decreasing" : "increasing"}`;
    case "nelson-4":
      return `${options.alternatingRun} points in a row alternating up and down`;
    case "we-2":
    case "nelson-5":
      return `${options.beyondTwoSigma.count} of ${options.beyondTwoSigma.window} points in a row beyond 2σ ${side} the centre line`;
    case "we-3":
    case "nelson-6":
      return `${options.beyondOneSigma.count} of ${options.beyondOneSigma.window} points in a row beyond 1σ ${side} the centre line`;
    case "nelson-7":
      return `${options.withinOneSigmaRun} points in a row within 1σ of the centre line`;
    case "nelson-8":
      return `${options.bothSidesRun} points in a row beyond 1σ, on both sides of the centre line`;
  }
}

/** Indexes where a run of consecutive non-zero entries starts (one per episode); empty for empty or all-zero input. */
export function episodeStarts(firing: Int8Array): number[] {
  const starts: number[] = [];
  for (let i = 0; i < firing.length; i++) {
    if (firing[i] !== 0 && (i === 0 || firing[i - 1] === 0)) starts.push(i);
  }
  return starts;
}
