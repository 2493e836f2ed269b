"use client";

import { getSpecificationFieldLabel } from "@/protocols";
import {
  absoluteUnits,
  createReference,
  readReferenceMode,
  specificationFieldNames,
  type ReferenceMode,
  type ReferenceQuantity,
} from "./reference-values";
import { errorId, fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { NumberInput } from "./number-input";
import { SelectInput } from "./select-input";
import { useDraftValue, usePathErrors, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const MODE_WORDS: Record<ReferenceMode, string> = {
  it: "multiple of It",
  spec: "cell specification",
  absolute: "fixed value",
};

const UNIT_WORDS: Record<string, string> = { mOhm: "mΩ", Ohm: "Ω" };
const renderSubLabel = (text: string) => <span className="text-xs text-ink-soft">{text}</span>;

/**
 * A current, voltage or resistance given as a multiple of It (currents only; It = rated capacity /
 * 1 h, IEC 61434), as a field of the cell specification, or as a value with its unit.
 */
export function QuantityReferenceInput({ path, label, quantity }: { path: string; label: string; quantity: ReferenceQuantity }) {
  const reference = useDraftValue<unknown>(path);
  const mode = readReferenceMode(reference);
  const update = useUpdateDraft();
  const errors = usePathErrors(path);
  const modeId = `${fieldId(path)}-mode`;
  const modes: ReferenceMode[] = quantity === "current" ? ["it", "spec", "absolute"] : ["spec", "absolute"];
  return (
    <fieldset id={fieldId(path)} tabIndex={-1} aria-describedby={errorId(path)} className="min-w-0">
      <legend className="text-sm font-medium">{label}</legend>
      <div className="grid grid-cols-[minmax(0,13rem)_minmax(0,18rem)] gap-2">
        <SelectField
          id={modeId}
          label={renderSubLabel("Given as")}
          value={mode}
          onChange={(e) => update(path, createReference(quantity, e.target.value as ReferenceMode))}
          className="w-full"
          options={modes.map((m) => ({ value: m, label: MODE_WORDS[m] }))}
        />
        {mode === "it" && <NumberInput path={`${path}.multipleOfIt`} label={renderSubLabel("Multiple of It")} hint="e.g. 0.2 for 0.2 It" />}
        {mode === "spec" && (
          <SelectInput
            path={`${path}.spec`}
            label={renderSubLabel("Specification field")}
            options={specificationFieldNames[quantity].map((name) => ({ value: name, label: getSpecificationFieldLabel(name) }))}
          />
        )}
        {mode === "absolute" && (
          <div className="grid grid-cols-[minmax(0,1fr)_5.5rem] gap-2">
            <NumberInput path={`${path}.value`} label={renderSubLabel("Value")} />
            <SelectInput
              path={`${path}.unit`}
              label={renderSubLabel("Unit")}
              options={absoluteUnits[quantity].map((unit) => ({ value: unit, label: UNIT_WORDS[unit] ?? unit }))}
            />
          </div>
        )}
      </div>
      <PathErrors path={path} errors={errors} />
    </fieldset>
  );
}
