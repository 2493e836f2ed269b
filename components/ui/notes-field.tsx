import type { ReactNode, TextareaHTMLAttributes } from "react";
import { describeControl, FieldFrame } from "./field-frame";

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
  return (
    <FieldFrame id={id} label={label} hint={hint} errors={errors}>
      <textarea
        id={id}
        name={name}
        rows={rows}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={describeControl(id, hint, errors)}
        className="rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates"
        {...textarea}
      />
    </FieldFrame>
  );
}
