"use client";

import { useState } from "react";
import { useFieldArray, useFormContext } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { acceptanceCriterionKinds, type AcceptanceCriterionKind } from "@/protocols";
import { createCriterion, type CriterionValue, type StepValue } from "./draft-values";
import { fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { CRITERION_WORDS, CriterionCard } from "./criterion-card";
import { DecisionRuleField } from "./decision-rule-field";
import { useDraftValue, usePathErrors, useRevalidate } from "./use-draft-field";
import { SelectField } from "@/components/ui/select-field";

const PATH = "definition.acceptance";

/** The acceptance criteria: what a run must show for the cell to meet the procedure. */
export function AcceptanceEditor() {
  const { control } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name: PATH });
  const criteria = useDraftValue<CriterionValue[] | undefined>(PATH) ?? [];
  const steps = useDraftValue<StepValue[] | undefined>("definition.steps") ?? [];
  const errors = usePathErrors(PATH);
  const revalidate = useRevalidate();
  const [newKind, setNewKind] = useState<AcceptanceCriterionKind>("capacity");
  const stepOptions = steps.map((step, index) => ({ value: step.id, label: `${index + 1} · ${step.label} (${step.kind}, id ${step.id})` }));
  return (
    <section aria-labelledby="acceptance-heading" className="flex flex-col gap-3">
      <h2 id="acceptance-heading" className="text-lg font-bold">
        Acceptance criteria
      </h2>
      <p className="text-sm text-ink-soft">
        Capacity and duration criteria judge a discharge step; a resistance criterion judges a pulse or an AC resistance measurement.
        With none, results are reported without a pass/fail statement.
      </p>
      <DecisionRuleField />
      <div id={fieldId(PATH)} tabIndex={-1}>
        <PathErrors path={PATH} errors={errors} />
      </div>
      {fields.map((field, index) => {
        const kind = (field as unknown as Partial<CriterionValue>).kind;
        if (!kind) return null;
        return (
          <CriterionCard
            key={field.id}
            index={index}
            kind={kind}
            criterionId={criteria[index]?.id ?? ""}
            stepOptions={stepOptions}
            onRemove={(at) => {
              remove(at);
              revalidate();
              document.getElementById(fieldId(PATH))?.focus();
            }}
          />
        );
      })}
      <div className="flex flex-wrap items-end gap-2 rounded border border-dashed border-rule p-3">
        <div className="min-w-0">
          <SelectField
            id="new-criterion-kind"
            label="Kind of the new criterion"
            value={newKind}
            onChange={(e) => setNewKind(e.target.value as AcceptanceCriterionKind)}
            className="w-full"
            options={acceptanceCriterionKinds.map((kind) => ({ value: kind, label: CRITERION_WORDS[kind] }))}
          />
        </div>
        <Button
          type="button"
          variant="secondary"
          onClick={() => {
            append(createCriterion(newKind, { existingIds: criteria.map((c) => c.id), steps }));
            revalidate();
          }}
        >
          Add criterion
        </Button>
      </div>
    </section>
  );
}
