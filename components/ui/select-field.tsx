import clsx from "clsx";
import type { ReactNode, SelectHTMLAttributes } from "react";
import { describeControl, FieldFrame } from "./field-frame";

export interface SelectOption {
  value: string;
  label: string;
}

export const SELECT_CLASS = "rounded border border-rule bg-white px-2 py-1.5 text-ink aria-[invalid=true]:border-deviates";

/**
 * The lab's drop-down on its own, for a control whose label stands elsewhere (a table row, a picker
 * with a status line): `options`, or `<option>` children. Everything else is the `<select>`'s own.
 */
export function Select({ options, className, children, ...select }: SelectHTMLAttributes<HTMLSelectElement> & { options?: readonly SelectOption[] }) {
  return (
    <select {...select} className={clsx(SELECT_CLASS, className)}>
      {options?.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
      {children}
    </select>
  );
}

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
  /** The form field's name; a choice kept in a client's state has none and gives an `id` instead. */
  name?: string;
  options?: readonly SelectOption[];
  errors?: string[];
  hint?: ReactNode;
  filter?: boolean;
}) {
  const id = select.id ?? `field-${name}`;
  const control = (
    <Select
      id={id}
      name={name}
      aria-invalid={errors?.length ? true : undefined}
      aria-describedby={describeControl(id, hint, errors)}
      {...select}
      options={options}
      className={className}
    >
      {children}
    </Select>
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
    <FieldFrame id={id} label={label} hint={hint} errors={errors}>
      {control}
    </FieldFrame>
  );
}
