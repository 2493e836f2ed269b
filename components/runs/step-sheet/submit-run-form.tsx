"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";
import { ActionAnswer } from "./action-answer";

/** Hands the run to review; the service refuses while a step is open and says which. */
export function SubmitRunForm({ action, runId, ready }: { action: (prev: ActionState, form: FormData) => Promise<ActionState>; runId: string; ready: boolean }) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  return (
    <form action={formAction} className="flex flex-col items-start gap-2 rounded border border-rule bg-white p-4">
      <input type="hidden" name="runId" value={runId} />
      <p className="text-sm">
        {ready
          ? "Every step is ticked. Submitting hands the run to an engineer for review; its records can then no longer change."
          : "Submit once every step is ticked."}
      </p>
      <Button type="submit" disabled={pending} className="min-h-11 px-4">
        {pending ? "Submitting…" : "Submit the run for review"}
      </Button>
      <ActionAnswer state={state} />
    </form>
  );
}
