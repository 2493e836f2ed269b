"use client";

import { useEffect, useRef, useState, useTransition } from "react";
import { FormProvider, useForm, type FieldValues, type UseFormSetError } from "react-hook-form";
import { PlainLink } from "@/components/ui/text-link";
import type { ActionState } from "@/lib/forms/action-state";
import type { ProcedureDraftInput } from "@/lib/procedures/procedure-input";
import { readDecisionRule } from "@/protocols";
import { AcceptanceEditor } from "./acceptance-editor";
import { draftResolver } from "./draft-resolver";
import type { DraftFormValues } from "./draft-values";
import { DraftPreview } from "./draft-preview";
import { ErrorSummary } from "./error-summary";
import { listServerErrors } from "./field-paths";
import { HeaderFields } from "./header-fields";
import { RepeatRuleEditor } from "./repeat-rule-editor";
import { RichTextFields } from "./rich-text-fields";
import { SaveBar } from "./save-bar";
import type { SaveDraftRequest } from "./save-draft-request";
import { StepsEditor } from "./steps-editor";

/**
 * The editor of one draft version. The form holds the draft in the shape the server validates and
 * is checked with the same zod schema (procedureDraftSchema, through draftResolver) before it is sent; the save action
 * receives the whole draft as an object and checks it again. Errors from either side are keyed by
 * the same path, shown beside their field and listed at the top.
 */
export function ProcedureEditor({
  procedureId,
  number,
  initial,
  save,
}: {
  procedureId: string;
  number: number;
  initial: ProcedureDraftInput;
  save: (request: SaveDraftRequest) => Promise<ActionState>;
}) {
  const form = useForm<DraftFormValues, unknown, ProcedureDraftInput>({
    resolver: draftResolver,
    // A draft saved before procedures named a decision rule opens with the rule it was judged by.
    defaultValues: { ...initial, definition: { ...initial.definition, decisionRule: readDecisionRule(initial.definition) } },
    mode: "onSubmit",
  });
  const [answer, setAnswer] = useState<ActionState | null>(null);
  const [pending, startTransition] = useTransition();
  const summaryRef = useRef<HTMLDivElement>(null);
  // Bumped after a refused save; focus moves to the summary once it shows the problems.
  const [refusals, setRefusals] = useState(0);
  useEffect(() => {
    if (refusals > 0) summaryRef.current?.focus();
  }, [refusals]);

  const onValid = (draft: ProcedureDraftInput) =>
    startTransition(async () => {
      const result = await save({ procedureId, number, draft });
      setAnswer(result);
      if (result.ok) {
        form.reset(form.getValues(), { keepValues: true });
        return;
      }
      const setError = form.setError as unknown as UseFormSetError<FieldValues>;
      for (const { path, message } of listServerErrors(result.fieldErrors)) setError(path, { type: "server", message });
      setRefusals((n) => n + 1);
    });

  const onInvalid = () => {
    setAnswer(null);
    setRefusals((n) => n + 1);
  };

  return (
    <FormProvider {...form}>
      <form
        onSubmit={(event) => void form.handleSubmit(onValid, onInvalid)(event)}
        noValidate
        aria-label="Procedure draft"
      >
        <ErrorSummary ref={summaryRef} answer={answer} />
        <p className="mb-4 text-sm">
          <PlainLink href="#preview-heading">
            Go to the preview on a cell
          </PlainLink>{" "}
          to see the set-points this draft gives for a chosen cell.
        </p>
        <div className="flex flex-col gap-8">
          <HeaderFields />
          <StepsEditor />
          <AcceptanceEditor />
          <RepeatRuleEditor />
          <RichTextFields />
          <SaveBar pending={pending} answer={answer} />
        </div>
      </form>
      <div className="mt-8">
        <DraftPreview />
      </div>
    </FormProvider>
  );
}
