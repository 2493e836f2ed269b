"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { NotesField } from "@/components/ui/notes-field";
import { SelectField } from "@/components/ui/select-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import type { LotOption } from "@/lib/specimens/form-option-types";
import { SpecificationSelect, type SpecificationOption } from "./specification-select";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export type { LotOption };

export interface SpecimenFormValues {
  id?: string;
  identifier?: string;
  cellSpecificationId: string;
  lotId: string | null;
  lotPosition?: number | null;
  receivedOn: string;
  conditionOnReceipt?: string;
  notes?: string | null;
}

const CONDITIONS = [
  "as received: sleeve intact, no dents, no leakage",
  "sleeve scuffed; can undamaged",
  "can dented: set aside for the engineer",
  "electrolyte smell or leakage: quarantined",
];

/** One cell as it arrived. Choosing a lot sets the cell specification and receipt date from the lot. */
export function SpecimenForm({
  action,
  specifications,
  lots,
  initial,
}: {
  action: Action;
  specifications: SpecificationOption[];
  lots: LotOption[];
  initial?: SpecimenFormValues;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  const [lotId, setLotId] = useState(initial?.lotId ?? "");
  const [specId, setSpecId] = useState(initial?.cellSpecificationId ?? "");
  const [receivedOn, setReceivedOn] = useState(initial?.receivedOn ?? "");
  const err = (k: string) => state.fieldErrors?.[k];
  const lot = lots.find((l) => l.id === lotId);
  const chooseLot = (id: string) => {
    setLotId(id);
    const chosen = lots.find((l) => l.id === id);
    if (!chosen) return;
    setSpecId(chosen.cellSpecificationId);
    if (!receivedOn) setReceivedOn(chosen.receivedOn);
  };
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Specimen" className="flex max-w-3xl flex-col gap-5">
      {state.message && !state.ok && (
        <Notice tone="problem" role="alert" title="Not saved">
          {state.message}
        </Notice>
      )}
      {initial?.id && <input type="hidden" name="id" value={initial.id} />}
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Specimen identifier" name="identifier" defaultValue={initial?.identifier} errors={err("identifier")} hint="As written on the cell." />
        <SelectField label="Lot" name="lotId" errors={err("lotId")} value={lotId} onChange={(e) => chooseLot(e.target.value)}>
          <option value="">none: a loose specimen</option>
          {lots.map((l) => (
            <option key={l.id} value={l.id}>
              {l.label}
            </option>
          ))}
        </SelectField>
        <Field
          label="Tray position, optional"
          name="lotPosition"
          inputMode="numeric"
          defaultValue={initial?.lotPosition?.toString() ?? ""}
          disabled={!lot}
          errors={err("lotPosition")}
          hint={
            lot
              ? `The cell's number in its lot, 1 to ${lot.quantityReceived}, as on the tray. The lot's drawn sample names positions.`
              : "Choose the lot first; a loose specimen has no tray position."
          }
        />
        <SpecificationSelect specifications={specifications} value={specId} onChange={setSpecId} errors={err("cellSpecificationId")} />
        <Field label="Received on" name="receivedOn" type="date" value={receivedOn} onChange={(e) => setReceivedOn(e.target.value)} errors={err("receivedOn")} />
      </div>
      <Field
        label="Condition on receipt"
        name="conditionOnReceipt"
        list="condition-suggestions"
        defaultValue={initial?.conditionOnReceipt}
        errors={err("conditionOnReceipt")}
        hint="What you saw when unpacking it: sleeve, can, terminals, smell, leakage."
      />
      <datalist id="condition-suggestions">
        {CONDITIONS.map((c) => (
          <option key={c} value={c} />
        ))}
      </datalist>
      <NotesField label="Notes, optional" name="notes" errors={err("notes")} defaultValue={initial?.notes ?? ""} />
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Saving…" : "Save specimen"}
      </Button>
    </form>
  );
}
