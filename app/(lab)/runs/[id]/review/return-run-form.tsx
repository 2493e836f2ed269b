"use client";

import { ActionAnswer } from "@/components/runs/step-sheet/action-answer";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";

/** Sends the run back to its operator; the comments are required and kept with the review. */
export function ReturnRunForm({
  action,
  runId,
  operatorName,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  runId: string;
  operatorName: string;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  const errors = state.fieldErrors?.comments;
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3" aria-labelledby="return-heading">
      <input type="hidden" name="runId" value={runId} />
      <label htmlFor="return-comments" className="text-sm font-medium">
        What {operatorName} must fix
      </label>
      <textarea
        id="return-comments"
        name="comments"
        required
        maxLength={4000}
        rows={5}
        aria-describedby="return-comments-hint return-comments-error"
        aria-invalid={errors ? true : undefined}
        className="rounded border border-rule bg-white px-2 py-1.5 aria-[invalid=true]:border-deviates"
      />
      <p id="return-comments-hint" className="text-xs text-ink-soft">
        {operatorName} reads these comments at the top of the step sheet and by e-mail. Nothing is deleted: they correct the records or upload the log again, and submit
        the run once more.
      </p>
      <p id="return-comments-error" aria-live="polite" className="text-sm text-deviates">
        {errors?.join(" ")}
      </p>
      <div>
        <Button type="submit" variant="secondary" disabled={pending} className="min-h-11 px-4">
          {pending ? "Returning…" : `Return the run to ${operatorName}`}
        </Button>
      </div>
      <ActionAnswer state={state} />
    </form>
  );
}
