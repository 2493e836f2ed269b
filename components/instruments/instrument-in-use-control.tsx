"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/** Takes an instrument out of use, or back into it; the answer is said next to the button. */
export function InstrumentInUseControl({ action, id, identifier, active }: { action: Action; id: string; identifier: string; active: boolean }) {
  const [state, dispatch, pending] = useActionState(action, initialActionState);
  return (
    <form action={dispatch} className="flex flex-col items-start gap-1">
      <input type="hidden" name="id" value={id} />
      <input type="hidden" name="active" value={active ? "false" : "true"} />
      <Button
        type="submit"
        variant={active ? "danger" : "secondary"}
        disabled={pending}
        aria-label={active ? `Take ${identifier} out of use` : `Put ${identifier} back into use`}
        className="whitespace-nowrap text-xs"
      >
        {active ? "Take out of use" : "Put back into use"}
      </Button>
      {state.message && (
        <p role={state.ok ? "status" : "alert"} className={state.ok ? "text-xs text-meets" : "text-xs text-deviates"}>
          {state.message}
        </p>
      )}
    </form>
  );
}
