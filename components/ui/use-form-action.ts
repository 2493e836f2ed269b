"use client";

import { useActionState, useEffect, useRef, useTransition, type FormEvent } from "react";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";

/**
 * Runs a server action from a form's submit event instead of its `action` prop: React resets a form
 * after an `action` runs, which would wipe what the person typed when the server refuses it.
 */
export function useFormAction(action: (prev: ActionState, form: FormData) => Promise<ActionState>) {
  const [state, dispatch, actionPending] = useActionState(action, initialActionState);
  const [transitionPending, startTransition] = useTransition();
  const form = useRef<HTMLFormElement | null>(null);
  // A refused signature never leaves the password it was refused with in the field.
  useEffect(() => {
    if (state === initialActionState || state.ok) return;
    form.current?.querySelectorAll<HTMLInputElement>("input[data-clear-when-refused]").forEach((input) => {
      input.value = "";
    });
  }, [state]);
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    form.current = event.currentTarget;
    const data = new FormData(event.currentTarget);
    startTransition(() => dispatch(data));
  };
  return { state, onSubmit, pending: actionPending || transitionPending };
}
