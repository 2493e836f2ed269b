"use client";

import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { fieldId } from "./field-paths";
import { OptionalPart } from "./optional-part";
import { QuantityReferenceInput } from "./quantity-reference-input";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

/** CC-CV charge: current, voltage, how the charge ends, and an optional longest duration. */
export function ChargeFields({ path }: { path: string }) {
  const termination = useDraftValue<{ kind?: string } | undefined>(`${path}.termination`);
  const update = useUpdateDraft();
  const endsId = fieldId(`${path}.termination.kind`);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <QuantityReferenceInput path={`${path}.current`} label="Charge current (constant-current phase)" quantity="current" />
      <QuantityReferenceInput path={`${path}.voltage`} label="Charge voltage (constant-voltage phase)" quantity="voltage" />
      <div className="sm:w-72">
        <SelectField
          id={endsId}
          label="The charge ends"
          value={termination?.kind ?? "current"}
          onChange={(e) =>
            update(
              `${path}.termination`,
              e.target.value === "time"
                ? { kind: "time", duration: createDuration("h") }
                : { kind: "current", current: { spec: "chargeTerminationCurrent" } },
            )
          }
          className="w-full"
          options={[
            { value: "current", label: "when the current falls to a limit" },
            { value: "time", label: "after a set time" },
          ]}
        />
      </div>
      {termination?.kind === "time" ? (
        <DurationInput path={`${path}.termination.duration`} label="Charge time" />
      ) : (
        <QuantityReferenceInput path={`${path}.termination.current`} label="Termination current" quantity="current" />
      )}
      <OptionalPart path={`${path}.maxDuration`} label="Stop the charge after a longest duration" create={() => createDuration("h")}>
        <DurationInput path={`${path}.maxDuration`} label="Longest duration" />
      </OptionalPart>
    </div>
  );
}
