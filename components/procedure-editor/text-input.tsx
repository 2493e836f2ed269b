"use client";

import type { ReactNode } from "react";
import { FieldShell, inputClass } from "./field-shell";
import { useDraftValue, usePathErrors, useUpdateDraft } from "./use-draft-field";

/**
 * Text at a form path. `optional` fields store blank as "not given" (undefined) rather than "".
 */
export function TextInput({
  path,
  label,
  hint,
  className,
  multiline = false,
  optional = false,
  readOnly = false,
}: {
  path: string;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
  multiline?: boolean;
  optional?: boolean;
  readOnly?: boolean;
}) {
  const value = useDraftValue<string | undefined>(path);
  const update = useUpdateDraft();
  const errors = usePathErrors(path);
  const onChange = (text: string) => update(path, optional && text === "" ? undefined : text);
  return (
    <FieldShell path={path} label={label} hint={hint} errors={errors} className={className}>
      {(control) =>
        multiline ? (
          <textarea {...control} value={value ?? ""} rows={multiline === true ? 2 : undefined} readOnly={readOnly} onChange={(e) => onChange(e.target.value)} className={inputClass} />
        ) : (
          <input {...control} type="text" value={value ?? ""} readOnly={readOnly} onChange={(e) => onChange(e.target.value)} className={inputClass} />
        )
      }
    </FieldShell>
  );
}
