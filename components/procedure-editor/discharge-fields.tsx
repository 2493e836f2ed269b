"use client";

import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { OptionalPart } from "./optional-part";
import { QuantityReferenceInput } from "./quantity-reference-input";
import { SelectInput } from "./select-input";

const PURPOSES = [
  { value: "measure", label: "measure the capacity (reported)" },
  { value: "precondition", label: "precondition the cell (not reported)" },
];

/** Constant-current discharge to an end voltage. */
export function DischargeFields({ path }: { path: string }) {
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <SelectInput path={`${path}.purpose`} label="Purpose" options={PURPOSES} className="sm:w-80" />
      <QuantityReferenceInput path={`${path}.current`} label="Discharge current" quantity="current" />
      <QuantityReferenceInput path={`${path}.endVoltage`} label="End voltage" quantity="voltage" />
      <OptionalPart path={`${path}.maxDuration`} label="Stop the discharge after a longest duration" create={() => createDuration("h")}>
        <DurationInput path={`${path}.maxDuration`} label="Longest duration" />
      </OptionalPart>
    </div>
  );
}
