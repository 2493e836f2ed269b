"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SelectField } from "@/components/ui/select-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { ACCURACY_BY_KIND, ACCURACY_QUANTITIES, type AccuracyQuantity, type AccuracySpecification } from "@/lib/instruments/accuracy";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_KINDS, type InstrumentKind } from "@/lib/instruments/instrument-kind";
import { AccuracyFields } from "./accuracy-fields";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export interface InstrumentFormValues {
  id: string;
  kind: InstrumentKind;
  identifier: string;
  serial: string;
  firmware: string | null;
  accuracy: AccuracySpecification;
  calibrationCertificate: string;
  calibratedOn: string;
  dueOn: string;
}

/** One instrument of the register; the accuracy parts asked for follow the kind chosen. */
export function InstrumentForm({ action, initial }: { action: Action; initial?: InstrumentFormValues }) {
  const { state, onSubmit, pending } = useFormAction(action);
  const [kind, setKind] = useState<InstrumentKind>(initial?.kind ?? "cycler-channel");
  const err = (k: string) => state.fieldErrors?.[k];
  const rule = ACCURACY_BY_KIND[kind];
  const shown = (q: AccuracyQuantity) => rule.required.includes(q) || rule.optional.includes(q);
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Instrument" className="flex max-w-4xl flex-col gap-5">
      {state.message && !state.ok && (
        <Notice tone="problem" role="alert" title="Not saved">
          {state.message}
        </Notice>
      )}
      {initial && <input type="hidden" name="id" value={initial.id} />}
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-serif text-lg font-bold">Instrument</legend>
        <SelectField label="Kind" name="kind" errors={err("kind")} value={kind} onChange={(e) => setKind(e.target.value as InstrumentKind)}>
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {INSTRUMENT_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <Field label="Identifier (the lab's label)" name="identifier" defaultValue={initial?.identifier} errors={err("identifier")} placeholder="e.g. CY1-CH03" />
        <Field label="Serial number" name="serial" defaultValue={initial?.serial} errors={err("serial")} />
        <Field label="Firmware, optional" name="firmware" defaultValue={initial?.firmware ?? undefined} errors={err("firmware")} />
      </fieldset>
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 font-serif text-lg font-bold">Accuracy specification</legend>
        <p className="text-sm text-ink-soft">
          As the maker or the calibration certificate states it, as limits ±. They enter the uncertainty budget as rectangular
          distributions.
        </p>
        {ACCURACY_QUANTITIES.map((q) => (
          <AccuracyFields
            key={q}
            quantity={q}
            hidden={!shown(q)}
            required={rule.required.includes(q)}
            initial={initial?.accuracy}
            errors={(k) => err(k)}
          />
        ))}
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className="mb-2 font-serif text-lg font-bold">Calibration</legend>
        <Field label="Calibration certificate number" name="calibrationCertificate" defaultValue={initial?.calibrationCertificate} errors={err("calibrationCertificate")} />
        <Field label="Calibrated on" name="calibratedOn" type="date" defaultValue={initial?.calibratedOn} errors={err("calibratedOn")} />
        <Field label="Calibration due on" name="dueOn" type="date" defaultValue={initial?.dueOn} errors={err("dueOn")} hint="The last day the calibration covers." />
      </fieldset>
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Saving…" : "Save instrument"}
      </Button>
    </form>
  );
}
