"use client";

import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import { changeOwnPasswordAction } from "./actions";

export function ChangePasswordForm() {
  const { state, onSubmit, pending } = useFormAction(changeOwnPasswordAction);
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.ok) formRef.current?.reset();
  }, [state]);
  return (
    <form ref={formRef} onSubmit={onSubmit} className="flex flex-col gap-3" aria-label="Change your password" noValidate>
      {state.message && (
        <Notice tone={state.ok ? "done" : "problem"} role={state.ok ? "status" : "alert"}>
          {state.message}
        </Notice>
      )}
      <Field label="Current password" name="currentPassword" type="password" autoComplete="current-password" errors={state.fieldErrors?.currentPassword} />
      <Field
        label="New password"
        name="newPassword"
        type="password"
        autoComplete="new-password"
        hint="At least 12 characters; a few ordinary words make a good passphrase. Not your e-mail, not a well-known password."
        errors={state.fieldErrors?.newPassword}
      />
      <div>
        <Button type="submit" disabled={pending}>
          {pending ? "Changing…" : "Change password"}
        </Button>
      </div>
    </form>
  );
}
