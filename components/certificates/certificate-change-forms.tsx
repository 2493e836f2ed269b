"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { NotesField } from "@/components/ui/notes-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

function ChangeForm({ number, action, kind }: { number: string; action: Action; kind: "amend" | "revoke" }) {
  const { state, onSubmit, pending } = useFormAction(action);
  const amend = kind === "amend";
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3" aria-label={amend ? "Issue an amended certificate" : "Revoke the certificate"} noValidate>
      <input type="hidden" name="number" value={number} />
      {state.message && (
        <Notice tone={state.ok ? "done" : "problem"} role={state.ok ? "status" : "alert"}>
          {state.message}
        </Notice>
      )}
      <NotesField label={amend ? "Why it is amended" : "Why it is revoked"} name="reason" errors={state.fieldErrors?.reason} id={`${kind}-reason`} required />
      <Field
        label="Your password, to sign"
        name="password"
        id={`${kind}-password`}
        type="password"
        autoComplete="current-password"
        data-clear-when-refused
        errors={state.fieldErrors?.password}
        hint={amend ? "Signing means: approved — you authorise the replacement for issue." : "Signing means: you withdraw the certificate from use; it stays on record as revoked."}
      />
      <div>
        <Button type="submit" variant={amend ? "primary" : "danger"} disabled={pending || state.ok}>
          {pending ? "Signing…" : amend ? "Sign and issue the replacement" : "Sign and revoke"}
        </Button>
      </div>
    </form>
  );
}

/** Amendment (ISO/IEC 17025 7.8.8: a new certificate naming the one it replaces) and revocation. */
export function CertificateChangeForms({ number, amend, revoke }: { number: string; amend: Action; revoke: Action }) {
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <section aria-labelledby="amend-heading" className="rounded border border-rule bg-white p-4">
        <h3 id="amend-heading" className="mb-1 font-bold">
          Amend
        </h3>
        <p className="mb-3 text-sm text-ink-soft">
          Issues a new certificate from the same accepted run, stating that it replaces {number} and why. {number} then shows as superseded everywhere, including its public page.
        </p>
        <ChangeForm number={number} action={amend} kind="amend" />
      </section>
      <section aria-labelledby="revoke-heading" className="rounded border border-deviates bg-white p-4">
        <h3 id="revoke-heading" className="mb-1 font-bold">
          Revoke
        </h3>
        <p className="mb-3 text-sm text-ink-soft">For a certificate that must no longer be relied on and is not replaced. This cannot be undone.</p>
        <ChangeForm number={number} action={revoke} kind="revoke" />
      </section>
    </div>
  );
}
