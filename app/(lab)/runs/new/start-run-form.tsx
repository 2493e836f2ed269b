"use client";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";

type Option = { id: string; label: string };

export function StartRunForm({
  action,
  versions,
  specimens,
  instruments,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  versions: Option[];
  specimens: Option[];
  instruments: (Option & { calibration: string; overdue: boolean })[];
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  const err = (k: string) => state.fieldErrors?.[k]?.join(" ");
  return (
    <form onSubmit={onSubmit} className="flex max-w-3xl flex-col gap-5">
      <SelectField label="Procedure version (released)" name="procedureVersionId" required defaultValue="" errors={state.fieldErrors?.procedureVersionId}>
        <option value="" disabled>
          Choose…
        </option>
        {versions.map((o) => (
          <option key={o.id} value={o.id}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <SelectField label="Specimen" name="specimenId" required defaultValue="" errors={state.fieldErrors?.specimenId}>
        <option value="" disabled>
          Choose…
        </option>
        {specimens.map((o) => (
          <option key={o.id} value={o.id}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <fieldset className="flex flex-col gap-1 rounded border border-rule bg-white p-3" aria-describedby="in-error">
        <legend className="px-1 text-sm font-medium">Instruments used (the cycler channel, and the thermometer or chamber you read the ambient on)</legend>
        {instruments.map((i) => (
          <label key={i.id} className="flex min-h-11 items-start gap-3 py-1 text-sm">
            <input type="checkbox" name="instrumentIds" value={i.id} className="mt-0.5 size-5 accent-copper" />
            <span>
              <span className="font-medium">{i.label}</span>
              <span className={i.overdue ? "block text-deviates" : "block text-ink-soft"}>
                {i.overdue && <span aria-hidden="true">✕ </span>}
                {i.calibration}
              </span>
            </span>
          </label>
        ))}
        {instruments.length === 0 && <p className="text-sm text-ink-soft">No instruments in use in the register.</p>}
        <span id="in-error" aria-live="polite" className="text-sm text-deviates">
          {err("instrumentIds")}
        </span>
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Starting…" : "Start the run"}
        </Button>
        <p role="alert" aria-live="polite" className="text-sm text-deviates">
          {!state.ok && state.message}
        </p>
      </div>
    </form>
  );
}
