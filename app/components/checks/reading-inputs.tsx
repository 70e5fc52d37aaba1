import { ECCENTRICITY_POSITIONS, type EccentricityPosition } from "~/lib/check-readings";
import { inputClass } from "~/components/ui/field";

const POSITION_LABELS: Record<EccentricityPosition, string> = {
  centre: "Centre",
  "front-left": "Front left",
  "back-left": "Back left",
  "back-right": "Back right",
  "front-right": "Front right",
};

// Where each position sits on the drawn pan, in percent of the drawing (front is towards the operator, at the bottom).
const PLACE: Record<EccentricityPosition, string> = {
  centre: "left-1/2 top-1/2 -translate-x-1/2 -translate-y-1/2",
  "back-left": "left-[4%] top-[6%]",
  "back-right": "right-[4%] top-[6%]",
  "front-left": "left-[4%] bottom-[6%]",
  "front-right": "right-[4%] bottom-[6%]",
};

export function ListReadings({ count, unit, onInput, errors }: { count: number; unit: string; onInput: () => void; errors: Record<string, string> }) {
  return (
    <div className="grid grid-cols-2 gap-3 sm:grid-cols-5">
      {Array.from({ length: count }, (_, i) => (
        <label key={i} className="flex flex-col gap-1 text-sm">
          <span className="text-ink-soft">Reading {i + 1} ({unit})</span>
          <input name="readings" inputMode="decimal" autoComplete="off" onInput={onInput} className={inputClass} aria-invalid={errors[`/readings/${i}`] ? true : undefined} aria-describedby={errors[`/readings/${i}`] ? `reading-${i}-error` : undefined} />
          {errors[`/readings/${i}`] ? <span id={`reading-${i}-error`} className="text-xs text-out">{errors[`/readings/${i}`]}</span> : null}
        </label>
      ))}
    </div>
  );
}

/** The pan seen from above with one reading per position, in the order the load is moved. */
export function PanReadings({ unit, onInput, errors }: { unit: string; onInput: () => void; errors: Record<string, string> }) {
  return (
    <div className="relative mx-auto aspect-[4/3] w-full max-w-lg rounded-[2rem] border-2 border-ink-soft/40 bg-paper-deep/60">
      <span className="absolute bottom-1 left-1/2 -translate-x-1/2 text-xs text-ink-faint">Front (operator side)</span>
      {ECCENTRICITY_POSITIONS.map((position) => (
        <label key={position} className={`absolute flex w-36 flex-col gap-1 text-sm ${PLACE[position]}`}>
          <span className="text-ink-soft">{POSITION_LABELS[position]} ({unit})</span>
          <input name={position} inputMode="decimal" autoComplete="off" onInput={onInput} className={inputClass} aria-invalid={errors[`/readings/${position}`] ? true : undefined} />
          {errors[`/readings/${position}`] ? <span className="text-xs text-out">{errors[`/readings/${position}`]}</span> : null}
        </label>
      ))}
    </div>
  );
}
