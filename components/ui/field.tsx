import type { InputHTMLAttributes, ReactNode } from "react";
import { describeControl, FieldFrame } from "./field-frame";

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
  return (
    <FieldFrame id={id} label={label} hint={hint} errors={errors}>
      {children ?? (
        <input
          id={id}
          name={name}
          aria-invalid={errors?.length ? true : undefined}
          aria-describedby={describeControl(id, hint, errors)}
          className="rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates"
          {...input}
        />
      )}
    </FieldFrame>
  );
}
