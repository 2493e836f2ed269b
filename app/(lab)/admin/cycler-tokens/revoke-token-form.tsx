"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { useFormAction } from "@/components/ui/use-form-action";
import { revokeTokenAction } from "./actions";

export function RevokeTokenForm({ tokenId, label }: { tokenId: string; label: string }) {
  const { state, onSubmit, pending } = useFormAction(revokeTokenAction);
  if (state.ok) return <p role="status">{state.message}</p>;
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-1" aria-label={`Revoke the token ${label}`} noValidate>
      <p className="text-sm">In use</p>
      <input type="hidden" name="tokenId" value={tokenId} />
      <Field label="Reason to revoke" name="reason" id={`reason-${tokenId}`} autoComplete="off" errors={state.fieldErrors?.reason} />
      <div>
        <Button type="submit" variant="danger" disabled={pending}>
          {pending ? "Revoking…" : "Revoke"}
        </Button>
      </div>
      {state.message && !state.fieldErrors?.reason && (
        <p role="alert" className="text-sm text-deviates">
          {state.message}
        </p>
      )}
    </form>
  );
}
