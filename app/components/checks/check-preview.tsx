import { OutcomeBadge } from "~/components/ui/outcome-badge";
import { evaluateCheck, type InstrumentSpec, type RequirementSpec, type WeightSpec } from "~/lib/check-evaluation";
import { parseReadings } from "~/lib/check-readings";
import { formatMass, formatUncertainty } from "~/lib/units";
import type { CheckType, MassUnit } from "../../../db/schema/enums";

interface Props {
  type: CheckType;
  unit: MassUnit;
  readabilityG: string;
  instrument: InstrumentSpec;
  requirement: RequirementSpec;
  weight: WeightSpec | null;
  readings: unknown;
  today: string;
}

/** The same engine the server runs, evaluated as the readings are typed; the server recomputes on submit. */
export function CheckPreview(props: Props) {
  const parsed = parseReadings(props.readings, { type: props.type, unit: props.unit, readabilityG: props.readabilityG });
  if (!parsed.ok) {
    return <p className="text-sm text-ink-soft">{parsed.problems[0]?.message ?? "Type the readings to see the result."}</p>;
  }
  const judged = evaluateCheck({ type: props.type, instrument: props.instrument, requirement: props.requirement, weight: props.weight, readings: parsed.readings, checkDate: props.today });
  if (!judged.ok) return <p role="alert" className="text-sm text-out">{judged.problems.join(" ")}</p>;
  const e = judged.evaluation;
  const mass = (g: number) => formatMass(g, props.unit, props.readabilityG);
  const label = props.type === "sensitivity" ? "Sensitivity error E" : props.type === "repeatability" ? "Repeatability s (effective)" : "Largest eccentricity ΔI";
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" aria-live="polite">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="num font-semibold">{mass(e.resultG)}</dd>
      <dt className="text-ink-soft">Acceptance limit</dt>
      <dd className="num">± {mass(e.acceptanceG)}</dd>
      <dt className="text-ink-soft">Tolerance ({e.basis})</dt>
      <dd className="num">± {mass(e.toleranceG)}</dd>
      {e.expandedUncertaintyG !== null ? (
        <>
          <dt className="text-ink-soft">Uncertainty U (k = 2)</dt>
          <dd className="num">{formatUncertainty(e.expandedUncertaintyG, props.unit)}</dd>
        </>
      ) : null}
      {typeof e.details.minimumWeightG === "number" ? (
        <>
          <dt className="text-ink-soft">Minimum weight</dt>
          <dd className="num">{formatMass(e.details.minimumWeightG, "g", "0.0001")}</dd>
        </>
      ) : null}
      <dt className="text-ink-soft">Outcome</dt>
      <dd><OutcomeBadge outcome={e.outcome} /></dd>
    </dl>
  );
}
