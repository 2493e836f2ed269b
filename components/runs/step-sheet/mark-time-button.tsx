"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";
import { ActionAnswer } from "./action-answer";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/**
 * "Mark start" / "Mark end": the server stamps the time when the operator presses it. A step with
 * cautions is started only after each one is read and acknowledged, here, before the step.
 */
export function MarkTimeButton({
  action,
  runId,
  stepId,
  cycle,
  label,
  cautions = [],
}: {
  action: Action;
  runId: string;
  stepId: string;
  cycle: number;
  label: string;
  cautions?: { code: string; message: string }[];
}) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  return (
    <form action={formAction} className="flex flex-col items-start gap-2" data-testid={cautions.length > 0 ? "start-with-cautions" : undefined}>
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="stepId" value={stepId} />
      <input type="hidden" name="cycle" value={cycle} />
      {cautions.map((c) => (
        <div key={c.code} role="group" aria-label="Caution for this step" className="max-w-xl rounded border-l-4 border-copper bg-copper-wash px-4 py-3 text-sm">
          <p className="font-semibold">
            <span aria-hidden="true">⚠ </span>Caution before you start: this step exceeds or approaches the cell&apos;s limits
          </p>
          <p className="mt-1">{c.message}</p>
          <label className="mt-2 flex min-h-11 items-center gap-2 font-medium">
            <input type="checkbox" name="acknowledged" value={c.code} className="size-5 accent-copper" />I have read this caution
          </label>
        </div>
      ))}
      <Button type="submit" disabled={pending} className="min-h-11 px-4">
        {pending ? "Stamping…" : label}
      </Button>
      <ActionAnswer state={state} />
    </form>
  );
}
