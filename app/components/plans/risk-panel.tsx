import type { RiskAssessment } from "~/lib/risk";
import { CHECK_TYPES } from "../../../db/schema/enums";
import { CHECK_TYPE_LABELS } from "./due-badge";

const BAND_WORDS = { high: "High risk", medium: "Medium risk", low: "Low risk" } as const;

/** The risk model's suggestion and its reasoning, in words; it never changes the plan by itself. */
export function RiskPanel({ risk, title = "Suggested by the risk assessment", label = "Risk assessment", children }: { risk: RiskAssessment; title?: string; label?: string; children?: React.ReactNode }) {
  return (
    <section aria-label={label} className="rounded-md border border-rule bg-paper-deep/50 p-4 text-sm">
      <h3 className="font-semibold">{title}: {BAND_WORDS[risk.band]} <span className="num font-normal text-ink-soft">(score {risk.score} of 9)</span></h3>
      <ul className="mt-2 flex flex-wrap gap-x-6 gap-y-1">
        {CHECK_TYPES.filter((type) => risk.suggestedIntervals[type]).map((type) => (
          <li key={type}><span className="font-medium">{CHECK_TYPE_LABELS[type]}</span> every <span className="num">{risk.suggestedIntervals[type] === 1 ? "day" : `${risk.suggestedIntervals[type]} days`}</span></li>
        ))}
      </ul>
      <ol className="mt-3 list-decimal space-y-1 pl-5 text-ink-soft">
        {risk.reasoning.map((line) => <li key={line}>{line}</li>)}
      </ol>
      {risk.unfit ? <p role="alert" className="mt-2 font-medium text-out">The instrument is not fit for this smallest net weight; checking more often will not make it fit.</p> : null}
      {children}
    </section>
  );
}
