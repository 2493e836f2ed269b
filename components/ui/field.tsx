import type { InputHTMLAttributes, ReactNode } from "react";

/** A labelled input with its error announced next to it (aria-describedby + aria-live). */
export function Field({
  label,
  name,
  errors,
  hint,
  children,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  name: string;
  errors?: string[];
  hint?: ReactNode;
  children?: ReactNode;
}) {
  const id = input.id ?? `field-${name}`;
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : null, errors?.length ? errorId : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      {children ?? (
        <input
          id={id}
          name={name}
          aria-invalid={errors?.length ? true : undefined}
          aria-describedby={describedBy}
          className="rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates"
          {...input}
        />
      )}
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
