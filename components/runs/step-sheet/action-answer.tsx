import type { ActionState } from "@/lib/forms/action-state";

/** The server's answer to a form, announced: a confirmation, or the refusal in its own words. */
export function ActionAnswer({ id, state }: { id?: string; state: ActionState }) {
  return (
    <p id={id} role={state.ok ? "status" : "alert"} aria-live="polite" className={state.ok ? "text-sm text-meets" : "text-sm text-deviates"}>
      {state.message}
    </p>
  );
}
