"use client";

import type { Ref } from "react";
import { useFormContext, useFormState } from "react-hook-form";
import { PlainLink } from "@/components/ui/text-link";
import type { ActionState } from "@/lib/forms/action-state";
import type { StepValue } from "./draft-values";
import { describeFieldPath, fieldId, flattenFieldErrors, listPathAncestors } from "./field-paths";
import { useDraftValue } from "./use-draft-field";

/** Moves focus to the control of a path, or to the nearest part of the form that holds it. */
function focusPath(path: string) {
  for (const candidate of listPathAncestors(path)) {
    const element = document.getElementById(fieldId(candidate));
    if (element) {
      element.focus();
      element.scrollIntoView({ block: "center" });
      return;
    }
  }
}

/**
 * Why the draft was not saved: every problem with words for its field, its path, and a link that
 * moves focus to the field. Focused after a failed save; announced as an alert.
 */
export function ErrorSummary({ answer, ref }: { answer: ActionState | null; ref: Ref<HTMLDivElement> }) {
  const { control } = useFormContext();
  const { errors } = useFormState({ control });
  const labels = (useDraftValue<StepValue[] | undefined>("definition.steps") ?? []).map((step) => step?.label ?? "");
  const problems = flattenFieldErrors(errors).filter((p) => p.path !== "root.server");
  const failed = answer !== null && !answer.ok;
  const show = problems.length > 0 || failed;
  return (
    <div ref={ref} tabIndex={-1} role="alert" aria-labelledby={show ? "error-summary-heading" : undefined} className="focus:outline-2 focus:outline-copper">
      {show && (
        <div className="mb-6 rounded border-l-4 border-deviates bg-white px-4 py-3 text-sm">
          <h2 id="error-summary-heading" className="font-sans text-base font-semibold">
            <span aria-hidden="true">✕ </span>
            The draft was not saved
            {problems.length > 0 && `: ${problems.length === 1 ? "1 problem" : `${problems.length} problems`} to fix`}
          </h2>
          {failed && answer.message && <p className="mt-1">{answer.message}</p>}
          <ul className="mt-2 flex flex-col gap-1">
            {problems.map((problem) => (
              <li key={`${problem.path}:${problem.message}`}>
                <PlainLink
                  href={`#${fieldId(problem.path)}`}
                  onClick={(event) => {
                    event.preventDefault();
                    focusPath(problem.path);
                  }}
                 
                 className="font-medium">
                  {describeFieldPath(problem.path, labels)}
                </PlainLink>
                : {problem.message}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
