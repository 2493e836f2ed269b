"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";
import { ActionAnswer } from "./action-answer";

export interface SubmitReadinessView {
  /** What stands in the way (no log, no current evaluation), in words. */
  problems: string[];
  /** Deviations in the current evaluation; null when there is none. */
  deviations: number | null;
}

/**
 * Hands the run to review: only with every step ticked, the log stored and evaluated; with the
 * count of deviations confirmed when there are any. The service checks the same again.
 */
export function SubmitRunForm({
  action,
  runId,
  ready,
  readiness,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  runId: string;
  ready: boolean;
  readiness: SubmitReadinessView;
}) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const deviations = readiness.deviations ?? 0;
  const blocked = !ready || readiness.problems.length > 0;
  return (
    <form action={formAction} className="flex flex-col items-start gap-2 rounded border border-rule bg-white p-4" data-testid="submit-run">
      <input type="hidden" name="runId" value={runId} />
      <h2 className="font-semibold">Submit for review</h2>
      {!ready && <p className="text-sm">Submit once every step is ticked.</p>}
      {readiness.problems.length > 0 && (
        <ul className="list-disc pl-5 text-sm" data-testid="submit-problems">
          {readiness.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      {!blocked && (
        <p className="text-sm">
          Every step is ticked and the log is evaluated
          {deviations === 0 ? " with no deviation" : `: the evaluation found ${deviations} deviation${deviations === 1 ? "" : "s"}`}. Submitting hands the run to
          an engineer for review; its records can then no longer change.
        </p>
      )}
      {!blocked && deviations > 0 && (
        <label className="flex min-h-11 items-center gap-2 text-sm font-medium">
          <input type="checkbox" name="confirmDeviations" value={deviations} required className="size-5 accent-copper" />I have read the {deviations} deviation
          {deviations === 1 ? "" : "s"} on the Findings and results tab and submit the run with {deviations === 1 ? "it" : "them"}
        </label>
      )}
      <Button type="submit" disabled={pending} className="min-h-11 px-4">
        {pending ? "Submitting…" : "Submit the run for review"}
      </Button>
      <ActionAnswer state={state} />
    </form>
  );
}
