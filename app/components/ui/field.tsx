import type { ReactNode } from "react";

interface FieldProps {
  id: string;
  label: string;
  hint?: string;
  errors?: string[];
  children: ReactNode;
}

/** A labelled control with its hint and its errors announced to screen readers. */
export function Field({ id, label, hint, errors, children }: FieldProps) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium">
        {label}
      </label>
      {children}
      {hint ? <p id={`${id}-hint`} className="text-xs text-ink-faint">{hint}</p> : null}
      {errors?.length ? (
        <p id={`${id}-error`} role="alert" className="text-sm text-out">
          {errors.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

export const inputClass =
  "rounded-md border border-rule bg-card px-3 py-2 text-sm num aria-[invalid=true]:border-out focus:border-accent";
