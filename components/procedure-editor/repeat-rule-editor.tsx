"use client";

import { useFormContext } from "react-hook-form";
import { createRepeatRule, listStepRange, type CriterionValue, type RepeatRuleValue, type StepValue } from "./draft-values";
import { errorId, fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { NumberInput } from "./number-input";
import { OptionalPart } from "./optional-part";
import { SelectInput } from "./select-input";
import { TextInput } from "./text-input";
import { useDraftValue, useSubtreeErrors, useUpdateDraft } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const PATH = "definition.repeat";

/** The block of consecutive steps, chosen by its first and last step. */
function BlockPicker({ steps, rule }: { steps: readonly StepValue[]; rule: RepeatRuleValue }) {
  const update = useUpdateDraft();
  const ids = steps.map((step) => step.id);
  const first = rule.stepIds[0] ?? "";
  const last = rule.stepIds[rule.stepIds.length - 1] ?? "";
  const errors = useSubtreeErrors(`${PATH}.stepIds`).map((p) => p.message);
  const pick = (from: string, to: string) => update(`${PATH}.stepIds`, listStepRange(ids, from, to || from));
  const renderOption = (step: StepValue, index: number) => (
    <option key={`${index}-${step.id}`} value={step.id}>
      {index + 1} · {step.label} (id {step.id})
    </option>
  );
  const firstId = fieldId(`${PATH}.stepIds`);
  return (
    <fieldset aria-describedby={errorId(`${PATH}.stepIds`)} className="grid gap-2 sm:grid-cols-2">
      <legend className="text-sm font-medium">Repeated steps (consecutive, in procedure order)</legend>
      <SelectField id={firstId} label={<span className="text-xs text-ink-soft">From step</span>} value={first} onChange={(e) => pick(e.target.value, last)} className="w-full">
        {first === "" && <option value="">Choose…</option>}
        {steps.map(renderOption)}
      </SelectField>
      <SelectField
        id={`${firstId}-last`}
        label={<span className="text-xs text-ink-soft">To step</span>}
        value={last}
        onChange={(e) => pick(first || e.target.value, e.target.value)}
        className="w-full"
      >
        {last === "" && <option value="">Choose…</option>}
        {steps.map(renderOption)}
      </SelectField>
      <p className="figures text-xs text-ink-soft sm:col-span-2">
        {rule.stepIds.length > 0 ? `Repeats: ${rule.stepIds.join(", ")}` : "No steps chosen yet (the last step must not come before the first)."}
      </p>
      <div className="sm:col-span-2">
        <PathErrors path={`${PATH}.stepIds`} errors={errors} />
      </div>
    </fieldset>
  );
}

/** An optional rule that repeats a block of steps until a criterion is met, or up to a number of cycles. */
export function RepeatRuleEditor() {
  const { getValues } = useFormContext();
  const rule = useDraftValue<RepeatRuleValue | undefined>(PATH);
  const steps = useDraftValue<StepValue[] | undefined>("definition.steps") ?? [];
  const criteria = useDraftValue<CriterionValue[] | undefined>("definition.acceptance") ?? [];
  return (
    <section aria-labelledby="repeat-heading" id={fieldId(PATH)} tabIndex={-1} className="flex flex-col gap-3">
      <h2 id="repeat-heading" className="text-lg font-bold">
        Repeat rule
      </h2>
      <OptionalPart
        path={PATH}
        label="Repeat a block of steps until a criterion is met"
        create={() => createRepeatRule((getValues("definition.acceptance") as CriterionValue[]).map((c) => c.id))}
      >
        {rule && (
          <div className="grid gap-3 rounded border border-rule bg-white p-3">
            <TextInput path={`${PATH}.label`} label="Name of the repeated block" />
            <BlockPicker steps={steps} rule={rule} />
            <div className="grid gap-3 sm:grid-cols-2">
              <NumberInput path={`${PATH}.maxCycles`} label="At most this many cycles" integer />
              <SelectInput
                path={`${PATH}.stopWhenMet`}
                label="Stop at the first cycle that meets"
                options={criteria.map((c) => ({ value: c.id, label: c.id }))}
                placeholder="Choose a criterion…"
              />
            </div>
          </div>
        )}
      </OptionalPart>
    </section>
  );
}
