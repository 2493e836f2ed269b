"use client";

import { createDuration } from "./draft-values";
import { fieldId } from "./field-paths";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const CHARGE_ENDS = [
  { value: "current", label: "when the current falls to a limit" },
  { value: "time", label: "after a set time" },
];

/** The chosen way a charge ends ("current" or "time"), so the caller shows the matching field beside the choice. */
export function useChargeTermination(path: string) {
  return useDraftValue<{ kind?: string } | undefined>(path)?.kind ?? "current";
}

/**
 * How a CC-CV charge ends (at a termination current or after a set time), for a charge step and for the
 * charge of each cycle of a cycle block. Switching starts the new kind from its usual reference.
 */
export function ChargeEndChoice({ path }: { path: string }) {
  const kind = useChargeTermination(path);
  const update = useUpdateDraft();
  return (
    <div className="sm:w-72">
      <SelectField
        id={fieldId(`${path}.kind`)}
        label="The charge ends"
        value={kind}
        onChange={(e) =>
          update(
            path,
            e.target.value === "time"
              ? { kind: "time", duration: createDuration("h") }
              : { kind: "current", current: { spec: "chargeTerminationCurrent" } },
          )
        }
        className="w-full"
        options={CHARGE_ENDS}
      />
    </div>
  );
}
