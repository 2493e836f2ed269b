"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";
import { ActionAnswer } from "./action-answer";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/** "Mark start" / "Mark end": the server stamps the time when the operator presses it. */
export function MarkTimeButton({ action, runId, stepId, cycle, label }: { action: Action; runId: string; stepId: string; cycle: number; label: string }) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  return (
    <form action={formAction} className="flex flex-col gap-1">
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="stepId" value={stepId} />
      <input type="hidden" name="cycle" value={cycle} />
      <Button type="submit" disabled={pending} className="min-h-11 px-4">
        {pending ? "Stamping…" : label}
      </Button>
      <ActionAnswer state={state} />
    </form>
  );
}
