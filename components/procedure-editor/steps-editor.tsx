"use client";

import { useEffect, useRef, useState } from "react";
import { useFieldArray, useFormContext } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { stepKinds, type StepKind } from "@/protocols";
import { createStep, describeStepKind, type StepValue } from "./draft-values";
import { fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { StepCard } from "./step-card";
import { useDraftValue, usePathErrors, useRevalidate } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const PATH = "definition.steps";

/** The step list: add a step of a chosen kind, move steps up and down, remove them. */
export function StepsEditor() {
  const { control } = useFormContext();
  const { fields, append, remove, move } = useFieldArray({ control, name: PATH });
  const steps = useDraftValue<StepValue[] | undefined>(PATH) ?? [];
  const errors = usePathErrors(PATH);
  const revalidate = useRevalidate();
  const [newKind, setNewKind] = useState<StepKind>("charge");
  const focusNext = useRef<string[]>([]);
  // Steps start folded to their summary line (one or two steps start open); steps added while editing start open.
  const [initialCount] = useState(fields.length);

  useEffect(() => {
    if (focusNext.current.length === 0) return;
    const target = focusNext.current
      .map((id) => document.getElementById(id))
      .find((element) => element && !(element instanceof HTMLButtonElement && element.disabled));
    target?.focus();
    focusNext.current = [];
  });

  /** After a change to the list: where focus goes (first usable id), and a fresh check. */
  const finishListChange = (...focusIds: string[]) => {
    focusNext.current = focusIds;
    revalidate();
  };

  return (
    <section aria-labelledby="steps-heading" className="flex flex-col gap-3">
      <h2 id="steps-heading" className="text-lg font-bold">
        Steps
      </h2>
      <p className="text-sm text-ink-soft">
        The operator runs the steps top to bottom. Each set-point is a multiple of It, a value from the cell specification, or a fixed value.
      </p>
      <div id={fieldId(PATH)} tabIndex={-1}>
        <PathErrors path={PATH} errors={errors} />
      </div>
      <ol className="flex flex-col gap-3">
        {fields.map((field, index) => {
          // A step keeps its kind for life, so the kind the field array recorded is its kind now.
          const kind = (field as unknown as Partial<StepValue>).kind;
          if (!kind) return null;
          return (
            <li key={field.id}>
              <StepCard
                index={index}
                count={fields.length}
                kind={kind}
                startOpen={initialCount <= 2 || index >= initialCount}
                onMove={(from, to) => {
                  move(from, to);
                  const moved = fieldId(`${PATH}.${to}`);
                  finishListChange(`${moved}-${to < from ? "up" : "down"}`, moved);
                }}
                onRemove={(at) => {
                  remove(at);
                  finishListChange(fields.length > 1 ? fieldId(`${PATH}.${Math.min(at, fields.length - 2)}`) : fieldId(PATH));
                }}
              />
            </li>
          );
        })}
      </ol>
      <div className="flex flex-wrap items-end gap-2 rounded border border-dashed border-rule p-3">
        <SelectField
          id="new-step-kind"
          label="Kind of the new step"
          value={newKind}
          onChange={(e) => setNewKind(e.target.value as StepKind)}
          className="w-full"
          options={stepKinds.map((kind) => ({ value: kind, label: describeStepKind(kind) }))}
        />
        <Button
          type="button"
          variant="secondary"
          onClick={() => {
            append(createStep(newKind, steps.map((s) => s.id)));
            finishListChange(fieldId(`${PATH}.${fields.length}`));
          }}
        >
          Add step
        </Button>
      </div>
    </section>
  );
}
