"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState } from "@/lib/forms/action-state";
import { clearLimitAction } from "./actions";

export function ClearLimitButton({ email, address }: { email: string | null; address: string | null }) {
  const [state, action, pending] = useActionState(clearLimitAction, initialActionState);
  return (
    <form action={action} className="flex flex-col gap-1">
      <input type="hidden" name="email" value={email ?? ""} />
      <input type="hidden" name="address" value={address ?? ""} />
      <Button type="submit" variant="secondary" disabled={pending} aria-label={`Clear the limit for ${email ?? "any account"} from ${address ?? "any address"}`}>
        Clear
      </Button>
      {state.message && (
        <p role={state.ok ? "status" : "alert"} className={state.ok ? "text-sm text-meets" : "text-sm text-deviates"}>
          {state.message}
        </p>
      )}
    </form>
  );
}
