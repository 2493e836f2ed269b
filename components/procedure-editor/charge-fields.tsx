"use client";

import { ChargeEndChoice, useChargeTermination } from "./charge-end-choice";
import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { OptionalPart } from "./optional-part";
import { QuantityReferenceInput } from "./quantity-reference-input";

/** CC-CV charge: current, voltage, how the charge ends, and an optional longest duration. */
export function ChargeFields({ path }: { path: string }) {
  const termination = useChargeTermination(`${path}.termination`);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <QuantityReferenceInput path={`${path}.current`} label="Charge current (constant-current phase)" quantity="current" />
      <QuantityReferenceInput path={`${path}.voltage`} label="Charge voltage (constant-voltage phase)" quantity="voltage" />
      <ChargeEndChoice path={`${path}.termination`} />
      {termination === "time" ? (
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
