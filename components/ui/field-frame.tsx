import type { ReactNode } from "react";

/** The ids a control points at with aria-describedby: its hint and, when there is one, its error. */
export function describeControl(id: string, hint: ReactNode, errors: string[] | undefined): string | undefined {
  return [hint ? `${id}-hint` : null, errors?.length ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
}

/** Label above, the control, its hint, then its error announced as it appears (aria-live). */
export function FieldFrame({ id, label, hint, errors, children }: { id: string; label: ReactNode; hint?: ReactNode; errors?: string[]; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} aria-live="polite" className="text-sm text-deviates">
        {errors?.join(" ")}
      </p>
    </div>
  );
}
