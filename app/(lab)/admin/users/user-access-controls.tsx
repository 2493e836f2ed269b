"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState } from "@/lib/forms/action-state";
import { endSessionsAction, setPasswordAction } from "./actions";

/** Per person: a new password set by the administrator, and ending their sessions (both audited). */
export function UserAccessControls({ userId, name, sessions, isSelf }: { userId: string; name: string; sessions: number; isSelf: boolean }) {
  const [pwState, pwAction, pwPending] = useActionState(setPasswordAction, initialActionState);
  const [endState, endAction, endPending] = useActionState(endSessionsAction, initialActionState);
  if (isSelf) return <p className="text-sm text-ink-soft">Your own password: on Your account.</p>;
  const state = pwState.message ? pwState : endState;
  return (
    <div className="flex flex-col gap-1">
      <form action={pwAction} className="flex flex-wrap items-center gap-1">
        <input type="hidden" name="userId" value={userId} />
        <label className="sr-only" htmlFor={`pw-${userId}`}>
          New password for {name}
        </label>
        <input
          id={`pw-${userId}`}
          name="password"
          type="password"
          autoComplete="new-password"
          placeholder="new password"
          className="w-40 rounded border border-rule bg-white px-1 py-1 text-sm"
          aria-describedby={`access-${userId}`}
        />
        <Button type="submit" variant="secondary" disabled={pwPending} aria-label={`Set the typed password as ${name}'s password`}>
          Set password
        </Button>
      </form>
      <form action={endAction}>
        <input type="hidden" name="userId" value={userId} />
        <Button type="submit" variant="secondary" disabled={endPending || sessions === 0} aria-label={`Sign ${name} out everywhere`}>
          Sign out everywhere ({sessions})
        </Button>
      </form>
      {state.message && (
        <p id={`access-${userId}`} role={state.ok ? "status" : "alert"} className={state.ok ? "text-sm text-meets" : "text-sm text-deviates"}>
          {state.message}
        </p>
      )}
    </div>
  );
}
