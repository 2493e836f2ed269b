"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import { signInAction } from "./actions";

export function SignInForm({ next }: { next?: string }) {
  const { state, onSubmit, pending } = useFormAction(signInAction);
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      {state.message && (
        <Notice tone="problem" role="alert" title="Not signed in">
          {state.message}
        </Notice>
      )}
      <input type="hidden" name="next" value={next ?? ""} />
      <Field label="E-mail" name="email" type="email" autoComplete="username" required errors={state.fieldErrors?.email} />
      <Field
        label="Password"
        name="password"
        type="password"
        autoComplete="current-password"
        required
        errors={state.fieldErrors?.password}
      />
      <Button type="submit" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
