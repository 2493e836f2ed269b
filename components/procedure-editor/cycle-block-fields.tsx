"use client";

import { ChargeEndChoice, useChargeTermination } from "./charge-end-choice";
import { createDuration } from "./draft-values";
import { DurationInput } from "./duration-input";
import { NumberInput } from "./number-input";
import { OptionalPart } from "./optional-part";
import { QuantityReferenceInput } from "./quantity-reference-input";

function Part({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="grid gap-4 rounded border border-rule p-3 lg:grid-cols-2">
      <legend className="px-1 text-sm font-semibold">{title}</legend>
      {children}
    </fieldset>
  );
}

function RestSpan({ path, words }: { path: string; words: string }) {
  return (
    <>
      <DurationInput path={`${path}.minDuration`} label={`Shortest ${words}`} />
      <OptionalPart path={`${path}.maxDuration`} label={`Set a longest ${words}`} create={() => createDuration("h")}>
        <DurationInput path={`${path}.maxDuration`} label={`Longest ${words}`} />
      </OptionalPart>
    </>
  );
}

/**
 * Endurance in cycles: the cycle (charge, rest, discharge, rest), how many cycles, the capacity check and the
 * stop and acceptance shares of the rated capacity. The operator records the block once; the log carries the cycles.
 */
export function CycleBlockFields({ path }: { path: string }) {
  const termination = useChargeTermination(`${path}.charge.termination`);
  return (
    <div className="flex flex-col gap-4">
      <Part title="Charge of each cycle (CC-CV)">
        <QuantityReferenceInput path={`${path}.charge.current`} label="Charge current" quantity="current" />
        <QuantityReferenceInput path={`${path}.charge.voltage`} label="Charge voltage" quantity="voltage" />
        <ChargeEndChoice path={`${path}.charge.termination`} />
        {termination === "time" ? (
          <DurationInput path={`${path}.charge.termination.duration`} label="Charge time" />
        ) : (
          <QuantityReferenceInput path={`${path}.charge.termination.current`} label="Termination current" quantity="current" />
        )}
      </Part>
      <Part title="Rest after charge">
        <RestSpan path={`${path}.restAfterCharge`} words="rest after charge" />
      </Part>
      <Part title="Discharge of each cycle (constant current)">
        <QuantityReferenceInput path={`${path}.discharge.current`} label="Discharge current" quantity="current" />
        <QuantityReferenceInput path={`${path}.discharge.endVoltage`} label="End voltage" quantity="voltage" />
      </Part>
      <Part title="Rest after discharge">
        <RestSpan path={`${path}.restAfterDischarge`} words="rest after discharge" />
      </Part>
      <Part title="Cycles, capacity check and criteria">
        <NumberInput path={`${path}.maxCycles`} label="Number of cycles" hint="the test ends after this many cycles at the latest" integer className="sm:w-60" />
        <OptionalPart
          path={`${path}.capacityCheck`}
          label="Check the capacity every few cycles at its own discharge current"
          create={() => ({ everyCycles: undefined, current: { multipleOfIt: 0.2 } })}
        >
          <NumberInput path={`${path}.capacityCheck.everyCycles`} label="Capacity check every … cycles" integer className="sm:w-60" />
          <QuantityReferenceInput path={`${path}.capacityCheck.current`} label="Capacity-check discharge current" quantity="current" />
        </OptionalPart>
        <NumberInput
          path={`${path}.stopBelowPercentOfRated`}
          label="Stop when the capacity falls below (% of rated)"
          hint="read on the capacity checks, or on every cycle without them"
          className="sm:w-60"
        />
        <NumberInput
          path={`${path}.acceptAtLeastPercentOfRated`}
          label="Accept when the capacity after the last cycle is at least (% of rated)"
          className="sm:w-60"
        />
      </Part>
    </div>
  );
}
