import clsx from "clsx";
import type { ReactNode } from "react";
import { errorId, fieldId } from "./field-paths";

export interface ControlProps {
  id: string;
  "aria-describedby": string;
  "aria-invalid"?: true;
}

/** A label, the control, an optional hint and the errors of one form path, wired for screen readers. */
export function FieldShell({
  path,
  label,
  hint,
  errors,
  className,
  children,
}: {
  path: string;
  label: ReactNode;
  hint?: ReactNode;
  errors: readonly string[];
  className?: string;
  children: (control: ControlProps) => ReactNode;
}) {
  const id = fieldId(path);
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : "", errorId(path)].filter(Boolean).join(" ");
  return (
    <div className={clsx("flex min-w-0 flex-col gap-1", className)}>
      <label htmlFor={id} className="text-sm font-medium">
        {label}
      </label>
      {children({ id, "aria-describedby": describedBy, ...(errors.length > 0 && { "aria-invalid": true }) })}
      {hint && (
        <p id={hintId} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
      <p id={errorId(path)} aria-live="polite" className="text-sm text-deviates">
        {errors.join(" ")}
      </p>
    </div>
  );
}

export const inputClass =
  "w-full rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates [&[readonly]]:bg-paper-deep";

/** Errors recorded on a group of fields as a whole (e.g. a reference no form of which fits). */
export function PathErrors({ path, errors }: { path: string; errors: readonly string[] }) {
  return (
    <p id={errorId(path)} aria-live="polite" className="text-sm text-deviates">
      {errors.join(" ")}
    </p>
  );
}
