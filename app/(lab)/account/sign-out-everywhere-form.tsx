"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState } from "@/lib/forms/action-state";
import { signOutEverywhereAction } from "./actions";

export function SignOutEverywhereForm({ count }: { count: number }) {
  const [state, action, pending] = useActionState(signOutEverywhereAction, initialActionState);
  return (
    <form action={action} className="flex flex-col gap-1">
      <div>
        <Button type="submit" variant="danger" disabled={pending}>
          Sign out everywhere ({count} {count === 1 ? "session" : "sessions"})
        </Button>
      </div>
      {state.message && (
        <p role="alert" className="text-sm text-deviates">
          {state.message}
        </p>
      )}
    </form>
  );
}
