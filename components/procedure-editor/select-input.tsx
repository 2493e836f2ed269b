"use client";

import type { ReactNode } from "react";
import { FieldShell } from "./field-shell";
import { useDraftValue, usePathErrors, useUpdateDraft } from "./use-draft-field";
import { Select } from "@/components/ui/select-field";

export interface SelectOption {
  value: string;
  label: string;
}

/**
 * A choice at a form path. A value that matches no option (e.g. a step id that was renamed) is
 * kept and shown as such, so its error can be read beside it.
 */
export function SelectInput({
  path,
  label,
  options,
  hint,
  className,
  placeholder,
}: {
  path: string;
  label: ReactNode;
  options: readonly SelectOption[];
  hint?: ReactNode;
  className?: string;
  placeholder?: string;
}) {
  const value = useDraftValue<string | undefined>(path) ?? "";
  const update = useUpdateDraft();
  const errors = usePathErrors(path);
  const isKnown = options.some((option) => option.value === value);
  return (
    <FieldShell path={path} label={label} hint={hint} errors={errors} className={className}>
      {(control) => (
        <Select {...control} value={value} onChange={(e) => update(path, e.target.value)} className="w-full">
          {value === "" && <option value="">{placeholder ?? "Choose…"}</option>}
          {!isKnown && value !== "" && <option value={value}>“{value}” (not found)</option>}
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </Select>
      )}
    </FieldShell>
  );
}
