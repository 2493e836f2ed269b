import type { ReactNode, TextareaHTMLAttributes } from "react";

/** A labelled text area (notes, reasons, comments) with its error announced next to it, like `Field`. */
export function NotesField({
  label,
  name,
  errors,
  hint,
  rows = 3,
  ...textarea
}: TextareaHTMLAttributes<HTMLTextAreaElement> & { label: ReactNode; name: string; errors?: string[]; hint?: ReactNode }) {
  const id = textarea.id ?? `field-${name}`;
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [hint ? hintId : null, errors?.length ? errorId : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      <textarea
        id={id}
        name={name}
        rows={rows}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={describedBy}
        className="rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates"
        {...textarea}
      />
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
