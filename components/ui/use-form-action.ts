"use client";

import { useActionState, useTransition, type FormEvent } from "react";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";

/**
 * Runs a server action from a form's submit event instead of its `action` prop: React resets a form
 * after an `action` runs, which would wipe what the person typed when the server refuses it.
 */
export function useFormAction(action: (prev: ActionState, form: FormData) => Promise<ActionState>) {
  const [state, dispatch, actionPending] = useActionState(action, initialActionState);
  const [transitionPending, startTransition] = useTransition();
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    startTransition(() => dispatch(data));
  };
  return { state, onSubmit, pending: actionPending || transitionPending };
}
