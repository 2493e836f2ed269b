"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";
import { ActionAnswer } from "./action-answer";

/** Abandons the run with a reason, behind a disclosure so it is never pressed by chance. */
export function AbandonRunForm({ action, runId }: { action: (prev: ActionState, form: FormData) => Promise<ActionState>; runId: string }) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  return (
    <details className="rounded border border-rule bg-white p-4 text-sm" data-testid="abandon-run">
      <summary className="cursor-pointer font-semibold">Abandon this run…</summary>
      <form action={formAction} className="mt-3 flex flex-col items-start gap-2">
        <input type="hidden" name="runId" value={runId} />
        <p>
          For a run that cannot go on: the cell vented, the equipment failed, the wrong specimen was put on the channel. The run and everything recorded stay on
          file, shown as abandoned and on the specimen&apos;s page; it is never reviewed and counts in no statistic. This cannot be undone.
        </p>
        <label className="flex w-full max-w-xl flex-col">
          Why the run is abandoned
          <textarea name="reason" rows={2} required minLength={3} className="rounded border border-rule px-2 py-1.5" />
        </label>
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Abandoning…" : "Abandon the run"}
        </Button>
        <ActionAnswer state={state} />
      </form>
    </details>
  );
}
