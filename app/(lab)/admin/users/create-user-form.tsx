"use client";

import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SelectField } from "@/components/ui/select-field";
import { Notice } from "@/components/ui/notice";
import { ROLE_LABELS, ROLES } from "@/lib/auth/permissions";
import { useFormAction } from "@/components/ui/use-form-action";
import { createUserAction } from "./actions";

export function CreateUserForm() {
  const { state, onSubmit, pending } = useFormAction(createUserAction);
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.ok) formRef.current?.reset();
  }, [state]);
  return (
    <form ref={formRef} onSubmit={onSubmit} className="grid gap-3 sm:grid-cols-2" aria-label="Add a person" noValidate>
      {state.message && (
        <div className="sm:col-span-2">
          <Notice tone={state.ok ? "done" : "problem"} role={state.ok ? "status" : "alert"}>
            {state.message}
          </Notice>
        </div>
      )}
      <Field label="Name" name="displayName" autoComplete="off" errors={state.fieldErrors?.displayName} />
      <Field label="E-mail" name="email" type="email" autoComplete="off" errors={state.fieldErrors?.email} />
      <SelectField label="Role" name="role" errors={state.fieldErrors?.role} defaultValue="operator">
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABELS[r]}
          </option>
        ))}
      </SelectField>
      <Field
        label="First password"
        name="password"
        type="password"
        autoComplete="new-password"
        hint="At least 12 characters; a few ordinary words make a good passphrase. Not their e-mail, not a well-known password. Hand it over in person."
        errors={state.fieldErrors?.password}
      />
      <div className="sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? "Adding…" : "Add person"}
        </Button>
      </div>
    </form>
  );
}
