"use client";

import { errorId, fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { readTemperatureMode, switchTemperatureMode, type TemperatureMode } from "./reference-values";
import { NumberInput } from "./number-input";
import { useDraftValue, usePathErrors, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const renderSubLabel = (text: string) => <span className="text-xs text-ink-soft">{text}</span>;

/** A temperature range in °C: nominal ± tolerance, or lowest to highest. */
export function TemperatureRangeInput({ path, label }: { path: string; label: string }) {
  const range = useDraftValue<unknown>(path);
  const mode = readTemperatureMode(range);
  const update = useUpdateDraft();
  const errors = usePathErrors(path);
  const modeId = `${fieldId(path)}-mode`;
  return (
    <fieldset id={fieldId(path)} tabIndex={-1} aria-describedby={errorId(path)} className="min-w-0">
      <legend className="text-sm font-medium">{label}</legend>
      <div className="grid grid-cols-[minmax(0,13rem)_minmax(0,9rem)_minmax(0,9rem)] gap-2">
        <SelectField
          id={modeId}
          label={renderSubLabel("Given as")}
          value={mode}
          onChange={(e) => update(path, switchTemperatureMode(range, e.target.value as TemperatureMode))}
          className="w-full"
          options={[
            { value: "nominal", label: "nominal ± tolerance" },
            { value: "bounds", label: "lowest to highest" },
          ]}
        />
        {mode === "nominal" ? (
          <>
            <NumberInput path={`${path}.nominalC`} label={renderSubLabel("Nominal, °C")} />
            <NumberInput path={`${path}.toleranceC`} label={renderSubLabel("± tolerance, °C")} />
          </>
        ) : (
          <>
            <NumberInput path={`${path}.minC`} label={renderSubLabel("Lowest, °C")} />
            <NumberInput path={`${path}.maxC`} label={renderSubLabel("Highest, °C")} />
          </>
        )}
      </div>
      <PathErrors path={path} errors={errors} />
    </fieldset>
  );
}
