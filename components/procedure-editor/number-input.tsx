"use client";

import type { ReactNode } from "react";
import { parseNumberInput } from "./draft-values";
import { FieldShell, inputClass } from "./field-shell";
import { useDraftValue, usePathErrors, useTypedText, useUpdateDraft } from "./use-draft-field";

const formatNumberValue = (value: number | undefined) => (value === undefined || Number.isNaN(value) ? "" : String(value));

/** A number at a form path; blank means not given (the schema says "required" where it is). */
export function NumberInput({
  path,
  label,
  hint,
  className,
  integer = false,
}: {
  path: string;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
  integer?: boolean;
}) {
  const value = useDraftValue<number | undefined>(path);
  const update = useUpdateDraft();
  const errors = usePathErrors(path);
  const [text, setText] = useTypedText(value, { format: formatNumberValue, parse: parseNumberInput });
  return (
    <FieldShell path={path} label={label} hint={hint} errors={errors} className={className}>
      {(control) => (
        <input
          {...control}
          type="number"
          inputMode={integer ? "numeric" : "decimal"}
          step={integer ? 1 : "any"}
          value={text}
          onChange={(event) => {
            setText(event.target.value);
            update(path, parseNumberInput(event.target.value));
          }}
          className={`${inputClass} figures`}
        />
      )}
    </FieldShell>
  );
}
