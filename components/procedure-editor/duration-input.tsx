"use client";

import { durationUnits } from "@/protocols";
import { errorId, fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { NumberInput } from "./number-input";
import { SelectInput } from "./select-input";
import { usePathErrors } from "./use-draft-field";

const UNIT_OPTIONS = durationUnits.map((unit) => ({ value: unit, label: unit }));

/** A duration: a value and its unit (s, min, h). */
export function DurationInput({ path, label }: { path: string; label: string }) {
  const errors = usePathErrors(path);
  return (
    <fieldset id={fieldId(path)} tabIndex={-1} aria-describedby={errorId(path)} className="min-w-0">
      <legend className="text-sm font-medium">{label}</legend>
      <div className="grid grid-cols-[minmax(0,12rem)_5.5rem] gap-2">
        <NumberInput path={`${path}.value`} label={<span className="text-xs text-ink-soft">Value</span>} />
        <SelectInput path={`${path}.unit`} label={<span className="text-xs text-ink-soft">Unit</span>} options={UNIT_OPTIONS} />
      </div>
      <PathErrors path={path} errors={errors} />
    </fieldset>
  );
}
