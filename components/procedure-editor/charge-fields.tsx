"use client";

import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { fieldId } from "./field-paths";
import { inputClass } from "./field-shell";
import { OptionalPart } from "./optional-part";
import { QuantityReferenceInput } from "./quantity-reference-input";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";

/** CC-CV charge: current, voltage, how the charge ends, and an optional longest duration. */
export function ChargeFields({ path }: { path: string }) {
  const termination = useDraftValue<{ kind?: string } | undefined>(`${path}.termination`);
  const update = useUpdateDraft();
  const endsId = fieldId(`${path}.termination.kind`);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <QuantityReferenceInput path={`${path}.current`} label="Charge current (constant-current phase)" quantity="current" />
      <QuantityReferenceInput path={`${path}.voltage`} label="Charge voltage (constant-voltage phase)" quantity="voltage" />
      <div className="flex flex-col gap-1 sm:w-72">
        <label htmlFor={endsId} className="text-sm font-medium">
          The charge ends
        </label>
        <select
          id={endsId}
          value={termination?.kind ?? "current"}
          onChange={(e) =>
            update(
              `${path}.termination`,
              e.target.value === "time"
                ? { kind: "time", duration: createDuration("h") }
                : { kind: "current", current: { spec: "chargeTerminationCurrent" } },
            )
          }
          className={inputClass}
        >
          <option value="current">when the current falls to a limit</option>
          <option value="time">after a set time</option>
        </select>
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
