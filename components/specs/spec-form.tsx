"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SelectField } from "@/components/ui/select-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { cellShapes, computeDesignation, positiveElectrodeLetters, positiveElectrodeNames, type CellSpecification } from "@/protocols";
import { SPEC_NUMBER_FIELDS } from "./spec-fields";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/** Datasheet values of one cell type; the IEC 61960 designation is computed as you type. */
export function SpecForm({ action, initial }: { action: Action; initial?: { id: string; maker: string; model: string; data: CellSpecification } }) {
  const { state, onSubmit, pending } = useFormAction(action);
  const [designation, setDesignation] = useState(() => (initial ? describeDesignation(initial.data) : "fill in chemistry, shape and maximum dimensions"));
  const err = (k: string) => state.fieldErrors?.[k] ?? state.fieldErrors?.[`data.${k}`];
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="Cell specification"
      className="flex flex-col gap-5"
      onChange={(e) => setDesignation(designationFromForm(new FormData(e.currentTarget)))}
    >
      {state.message && !state.ok && (
        <Notice tone="problem" role="alert" title="Not saved">
          {state.message}
        </Notice>
      )}
      {initial && <input type="hidden" name="id" value={initial.id} />}
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 font-serif text-lg font-bold">Cell</legend>
        <Field label="Maker" name="maker" defaultValue={initial?.maker} errors={err("maker")} />
        <Field label="Model" name="model" defaultValue={initial?.model} errors={err("model")} />
        <SelectField label="Positive electrode (IEC 61960 letter)" name="positiveElectrode" errors={err("data.chemistry.positiveElectrode")} defaultValue={initial?.data.chemistry.positiveElectrode ?? "N"}>
          {positiveElectrodeLetters.map((l) => (
            <option key={l} value={l}>
              {l}: {positiveElectrodeNames[l]}
            </option>
          ))}
        </SelectField>
        <Field label="Chemistry as the maker names it" name="chemistryLabel" placeholder="e.g. NMC" defaultValue={initial?.data.chemistry.label} errors={err("data.chemistry.label")} />
        <SelectField label="Shape" name="shape" errors={err("data.shape")} defaultValue={initial?.data.shape ?? "cylindrical"}>
          {cellShapes.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </SelectField>
        <div className="flex flex-col gap-1">
          <span className="text-sm font-medium">Designation (IEC 61960 5.1, computed)</span>
          <output className="rounded border border-dashed border-rule px-2 py-1.5 font-mono" aria-live="polite" data-testid="designation">
            {designation}
          </output>
        </div>
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="mb-2 font-serif text-lg font-bold">Datasheet values</legend>
        {SPEC_NUMBER_FIELDS.map((f) => (
          <Field
            key={f.key}
            label={`${f.label} (${f.unit})${f.required ? "" : ", optional"}`}
            name={f.key}
            inputMode="decimal"
            defaultValue={initial?.data[f.key]?.toString()}
            errors={err(`data.${f.key}`)}
          />
        ))}
      </fieldset>
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Saving…" : "Save specification"}
      </Button>
    </form>
  );
}

function describeDesignation(data: Parameters<typeof computeDesignation>[0]): string {
  const d = computeDesignation(data);
  return d.ok ? d.designation : d.message;
}

function designationFromForm(f: FormData): string {
  const num = (k: string) => {
    const v = Number(String(f.get(k) ?? "").replace(",", "."));
    return String(f.get(k) ?? "").trim() && Number.isFinite(v) ? v : undefined;
  };
  const height = num("maxHeightMm");
  if (height === undefined) return "fill in the maximum height";
  return describeDesignation({
    chemistry: { positiveElectrode: String(f.get("positiveElectrode")) as CellSpecification["chemistry"]["positiveElectrode"] },
    shape: String(f.get("shape")) as CellSpecification["shape"],
    maxDiameterMm: num("maxDiameterMm"),
    maxThicknessMm: num("maxThicknessMm"),
    maxWidthMm: num("maxWidthMm"),
    maxHeightMm: height,
  });
}
