"use client";

import { Button } from "@/components/ui/button";
import { assertNever, type AcceptanceCriterionKind } from "@/protocols";
import { DurationInput } from "./duration-input";
import { fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { NumberInput } from "./number-input";
import { QuantityReferenceInput } from "./quantity-reference-input";
import { SelectInput, type SelectOption } from "./select-input";
import { TextInput } from "./text-input";
import { usePathErrors } from "./use-draft-field";

export const CRITERION_WORDS: Record<AcceptanceCriterionKind, string> = {
  capacity: "Capacity at least a share of the rated or minimum capacity",
  "discharge-duration": "Discharge lasts at least a time",
  resistance: "Resistance at most a limit",
};

function CriterionKindFields({ kind, path }: { kind: AcceptanceCriterionKind; path: string }) {
  switch (kind) {
    case "capacity":
      return (
        <div className="grid gap-3 sm:grid-cols-2">
          <NumberInput path={`${path}.atLeastPercent`} label="At least, % of" />
          <SelectInput
            path={`${path}.of`}
            label="Compared with"
            options={[
              { value: "rated", label: "the rated capacity" },
              { value: "minimum", label: "the minimum capacity" },
            ]}
          />
        </div>
      );
    case "discharge-duration":
      return <DurationInput path={`${path}.atLeast`} label="The discharge lasts at least" />;
    case "resistance":
      return <QuantityReferenceInput path={`${path}.atMost`} label="Resistance at most" quantity="resistance" />;
    default:
      return assertNever(kind);
  }
}

/** One acceptance criterion: which step it judges and its limit. */
export function CriterionCard({
  index,
  kind,
  criterionId,
  stepOptions,
  onRemove,
}: {
  index: number;
  kind: AcceptanceCriterionKind;
  criterionId: string;
  stepOptions: readonly SelectOption[];
  onRemove: (index: number) => void;
}) {
  const path = `definition.acceptance.${index}`;
  const errors = usePathErrors(path);
  return (
    <section id={fieldId(path)} tabIndex={-1} aria-label={`Criterion ${index + 1}`} className="grid gap-3 rounded border border-rule bg-white p-3">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <p className="font-medium">
          <span className="figures text-copper-deep">Criterion {index + 1}</span> · {CRITERION_WORDS[kind]}
        </p>
        <Button type="button" variant="danger" aria-label={`Remove criterion ${index + 1}${criterionId ? ` (${criterionId})` : ""}`} onClick={() => onRemove(index)}>
          Remove
        </Button>
      </div>
      <PathErrors path={path} errors={errors} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput path={`${path}.id`} label="Criterion id" hint="The repeat rule names the criterion by this id." />
        <SelectInput path={`${path}.stepId`} label="Judges step" options={stepOptions} placeholder="Choose a step…" />
      </div>
      <CriterionKindFields kind={kind} path={path} />
    </section>
  );
}
