"use client";

import { useFormContext, useFormState } from "react-hook-form";
import { Button } from "@/components/ui/button";
import type { ActionState } from "@/lib/forms/action-state";

/** The save button, kept in view at the bottom of the form, with what happened to the last save. */
export function SaveBar({ pending, answer }: { pending: boolean; answer: ActionState | null }) {
  const { control } = useFormContext();
  const { isDirty } = useFormState({ control });
  return (
    <div className="sticky bottom-0 z-10 -mx-2 flex flex-wrap items-center gap-3 border-t border-rule bg-paper-deep px-3 py-2 shadow-[0_-2px_6px_rgba(0,0,0,0.06)]">
      <Button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Save draft"}
      </Button>
      <p className="text-sm text-ink-soft">{isDirty ? "Unsaved changes" : "No unsaved changes"}</p>
      <p role="status" aria-live="polite" className="text-sm font-medium text-meets">
        {!pending && answer?.ok ? `✓ ${answer.message ?? "Saved."}` : ""}
      </p>
    </div>
  );
}
