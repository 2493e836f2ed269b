import clsx from "clsx";
import type { ReactNode, SelectHTMLAttributes } from "react";

export interface SelectOption {
  value: string;
  label: string;
}

export const SELECT_CLASS = "rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates";

/**
 * A labelled choice with its error announced next to it, like `Field`. Give `options`, or `<option>`
 * children when the list needs groups. `filter` draws it small for a list's filter bar (no error line).
 */
export function SelectField({
  label,
  name,
  options,
  errors,
  hint,
  filter,
  className,
  children,
  ...select
}: SelectHTMLAttributes<HTMLSelectElement> & {
  label: ReactNode;
  name: string;
  options?: readonly SelectOption[];
  errors?: string[];
  hint?: ReactNode;
  filter?: boolean;
}) {
  const id = select.id ?? `field-${name}`;
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : null, errors?.length ? errorId : null].filter(Boolean).join(" ") || undefined;
  const control = (
    <select
      id={id}
      name={name}
      aria-invalid={errors?.length ? true : undefined}
      aria-describedby={describedBy}
      {...select}
      className={clsx(SELECT_CLASS, className)}
    >
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {children}
    </select>
  );
  if (filter) {
    return (
      <label htmlFor={id} className="flex flex-col text-sm">
        {label}
        {control}
      </label>
    );
  }
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {control}
      {hint && (
        <p id={hintId} className="text-xs text-ink-soft">
          {hint}
        </p>
      )}
      <p id={errorId} aria-live="polite" className="text-sm text-deviates">
        {errors?.join(" ")}
      </p>
    </div>
  );
}
