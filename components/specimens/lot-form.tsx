"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { NotesField } from "@/components/ui/notes-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { SpecificationSelect, type SpecificationOption } from "./specification-select";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export interface LotFormValues {
  id: string;
  identifier: string;
  cellSpecificationId: string;
  supplier: string;
  customer: string | null;
  quantityReceived: number;
  receivedOn: string;
  notes: string | null;
}

/** A lot as received: what cells, from whom, how many, when. */
export function LotForm({ action, specifications, initial }: { action: Action; specifications: SpecificationOption[]; initial?: LotFormValues }) {
  const { state, onSubmit, pending } = useFormAction(action);
  const err = (k: string) => state.fieldErrors?.[k];
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Lot" className="flex max-w-3xl flex-col gap-5">
      {state.message && !state.ok && (
        <Notice tone="problem" role="alert" title="Not saved">
          {state.message}
        </Notice>
      )}
      {initial && <input type="hidden" name="id" value={initial.id} />}
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Lot identifier" name="identifier" defaultValue={initial?.identifier} errors={err("identifier")} hint="As on the delivery note or the box label." />
        <SpecificationSelect specifications={specifications} defaultValue={initial?.cellSpecificationId} errors={err("cellSpecificationId")} />
        <Field label="Supplier" name="supplier" defaultValue={initial?.supplier} errors={err("supplier")} />
        <Field
          label="Customer, optional"
          name="customer"
          defaultValue={initial?.customer ?? ""}
          errors={err("customer")}
          hint="Who the results are reported to. Leave empty for the lab's own (in-house) work."
        />
        <Field
          label="Quantity received (cells)"
          name="quantityReceived"
          inputMode="numeric"
          defaultValue={initial?.quantityReceived.toString()}
          errors={err("quantityReceived")}
          hint="The cells are numbered 1 to this on the tray; the sampling plan's lot size."
        />
        <Field label="Received on" name="receivedOn" type="date" defaultValue={initial?.receivedOn} errors={err("receivedOn")} />
      </div>
      <NotesField label="Notes, optional" name="notes" errors={err("notes")} defaultValue={initial?.notes ?? ""} />
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Saving…" : "Save lot"}
      </Button>
    </form>
  );
}
