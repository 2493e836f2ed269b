"use client";

import { frequencyUnits, type MeasurementQuantity } from "@/protocols";
import { fieldId } from "./field-paths";
import { NumberInput } from "./number-input";
import { SelectInput } from "./select-input";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const QUANTITIES: { value: MeasurementQuantity; label: string }[] = [
  { value: "openCircuitVoltage", label: "open-circuit voltage" },
  { value: "mass", label: "mass" },
  { value: "acResistance", label: "AC resistance" },
  { value: "dimensions", label: "dimensions" },
];

/** A measurement without current: mass, open-circuit voltage, AC resistance at a frequency, dimensions. */
export function MeasureFields({ path }: { path: string }) {
  const measurement = useDraftValue<{ quantity?: string } | undefined>(`${path}.measurement`);
  const update = useUpdateDraft();
  const id = fieldId(`${path}.measurement.quantity`);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <div className="sm:w-72">
        <SelectField
          id={id}
          label="Measure"
          value={measurement?.quantity ?? "openCircuitVoltage"}
          onChange={(e) => {
            const quantity = e.target.value;
            update(`${path}.measurement`, quantity === "acResistance" ? { quantity, frequency: { value: undefined, unit: "kHz" } } : { quantity });
          }}
          className="w-full"
          options={QUANTITIES}
        />
      </div>
      {measurement?.quantity === "acResistance" && (
        <fieldset className="grid grid-cols-[minmax(0,1fr)_5.5rem] gap-2 sm:w-80">
          <legend className="text-sm font-medium">Frequency</legend>
          <NumberInput path={`${path}.measurement.frequency.value`} label={<span className="text-xs text-ink-soft">Value</span>} />
          <SelectInput
            path={`${path}.measurement.frequency.unit`}
            label={<span className="text-xs text-ink-soft">Unit</span>}
            options={frequencyUnits.map((u) => ({ value: u, label: u }))}
          />
        </fieldset>
      )}
    </div>
  );
}
