"use client";

import { useActionState, useId } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type ActionState } from "@/lib/forms/action-state";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/** One lifecycle step as a small form: a button, optionally a reason, and the answer beside it. */
export function VersionActionForm({
  action,
  versionId,
  label,
  variant = "secondary",
  reasonLabel,
}: {
  action: Action;
  versionId: string;
  label: string;
  variant?: "primary" | "secondary" | "danger";
  reasonLabel?: string;
}) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const id = useId();
  return (
    <form action={formAction} className="flex flex-col gap-1 rounded border border-rule bg-white p-3">
      <input type="hidden" name="versionId" value={versionId} />
      {reasonLabel && (
        <label className="flex flex-col text-sm" htmlFor={`${id}-reason`}>
          {reasonLabel}
          <textarea
            id={`${id}-reason`}
            name={reasonLabel.toLowerCase().startsWith("comment") ? "comment" : "reason"}
            rows={2}
            className="rounded border border-rule px-2 py-1"
            aria-describedby={`${id}-answer`}
          />
        </label>
      )}
      <Button type="submit" variant={variant} disabled={pending} className="self-start">
        {pending ? "Working…" : label}
      </Button>
      <p id={`${id}-answer`} role={state.ok ? "status" : "alert"} aria-live="polite" className={state.ok ? "text-sm text-meets" : "text-sm text-deviates"}>
        {state.message}
        {state.fieldErrors && Object.values(state.fieldErrors).flat().map((m) => ` ${m}`)}
      </p>
    </form>
  );
}
