"use client";

import { useState } from "react";
import { useFormContext } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { describeStep, stepSchema, type StepKind } from "@/protocols";
import { describeStepKind } from "./draft-values";
import { fieldId } from "./field-paths";
import { PathErrors } from "./field-shell";
import { OptionalPart } from "./optional-part";
import { StepKindFields } from "./step-kind-fields";
import { TemperatureRangeInput } from "./temperature-range-input";
import { TextInput } from "./text-input";
import { useDraftValue, useSubtreeErrors } from "./use-draft-field";

function summarise(step: unknown): string {
  const parsed = stepSchema.safeParse(step);
  return parsed.success ? describeStep(parsed.data) : "Not valid yet: see the fields below.";
}

/** One step: its summary line, move and remove buttons, and (when open) its fields. */
export function StepCard({
  index,
  count,
  kind,
  startOpen,
  onMove,
  onRemove,
}: {
  index: number;
  count: number;
  kind: StepKind;
  startOpen: boolean;
  onMove: (from: number, to: number) => void;
  onRemove: (index: number) => void;
}) {
  const path = `definition.steps.${index}`;
  const { getValues } = useFormContext();
  const step = useDraftValue<{ label?: string } | undefined>(path);
  const problems = useSubtreeErrors(path);
  const [open, setOpen] = useState(startOpen);
  const expanded = open || problems.length > 0;
  const n = index + 1;
  const headingId = `${fieldId(path)}-heading`;
  const bodyId = `${fieldId(path)}-body`;
  return (
    <section id={fieldId(path)} tabIndex={-1} aria-labelledby={headingId} className="rounded border border-rule bg-white p-3 sm:p-4">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 id={headingId} className="font-serif text-base font-bold">
            <span className="figures text-copper-deep">Step {n}</span> · {step?.label || "(no label)"}{" "}
            <span className="font-sans text-xs font-normal text-ink-soft">({describeStepKind(kind)})</span>
          </h3>
          <p className="figures text-sm text-ink-soft">{summarise(step)}</p>
          {problems.length > 0 && <p className="text-sm font-medium text-deviates">{problems.length === 1 ? "1 problem" : `${problems.length} problems`} in this step</p>}
        </div>
        <div className="flex flex-wrap gap-1">
          <Button
            type="button"
            variant="secondary"
            aria-expanded={expanded}
            aria-controls={expanded ? bodyId : undefined}
            disabled={problems.length > 0}
            onClick={() => setOpen(!expanded)}
          >
            {expanded ? "Hide fields" : "Edit fields"}
            <span className="sr-only"> of step {n}</span>
          </Button>
          <Button id={`${fieldId(path)}-up`} type="button" variant="secondary" aria-label={`Move step ${n} up`} disabled={index === 0} onClick={() => onMove(index, index - 1)}>
            ↑
          </Button>
          <Button id={`${fieldId(path)}-down`} type="button" variant="secondary" aria-label={`Move step ${n} down`} disabled={index === count - 1} onClick={() => onMove(index, index + 1)}>
            ↓
          </Button>
          <Button type="button" variant="danger" aria-label={`Remove step ${n}`} onClick={() => onRemove(index)}>
            Remove
          </Button>
        </div>
      </div>
      <PathErrors path={path} errors={problems.filter((p) => p.path === path).map((p) => p.message)} />
      {expanded && (
        <div id={bodyId} className="mt-3 grid gap-4 border-t border-rule pt-3">
          <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
            <TextInput path={`${path}.label`} label="Label" />
            <TextInput path={`${path}.id`} label="Step id" hint="Criteria and the repeat rule name the step by this id." />
          </div>
          <StepKindFields kind={kind} path={path} />
          {kind !== "soak" && (
            <OptionalPart path={`${path}.ambient`} label="This step has its own ambient range" create={() => getValues("definition.header.ambient")}>
              <TemperatureRangeInput path={`${path}.ambient`} label="Ambient for this step" />
            </OptionalPart>
          )}
          <TextInput path={`${path}.instructions`} label="Instructions to the operator (plain text, optional)" multiline optional />
        </div>
      )}
    </section>
  );
}
