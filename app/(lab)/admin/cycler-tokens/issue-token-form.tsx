"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { SelectField, type SelectOption } from "@/components/ui/select-field";
import { useFormAction } from "@/components/ui/use-form-action";
import type { IssuedTokenState } from "@/lib/machine-tokens/issued-token-state";
import { issueTokenAction } from "./actions";

export function IssueTokenForm({ channels, defaultDays, maxDays }: { channels: SelectOption[]; defaultDays: number; maxDays: number }) {
  const { state: formState, onSubmit, pending } = useFormAction(issueTokenAction);
  const state = formState as IssuedTokenState;
  return (
    <div className="flex flex-col gap-4">
      {state.issued ? (
        <IssuedToken key={state.issued.token} issued={state.issued} />
      ) : (
        state.message && (
          <Notice tone="problem" role="alert">
            {state.message}
          </Notice>
        )
      )}
      <form onSubmit={onSubmit} className="grid gap-3 sm:grid-cols-3" aria-label="Issue a token" noValidate>
        <SelectField label="Cycler channel" name="instrumentId" options={channels} errors={state.fieldErrors?.instrumentId} />
        <Field label="Label" name="label" autoComplete="off" hint="Which PC or cycler it goes on, e.g. “Cycler PC, bay 2”." errors={state.fieldErrors?.label} />
        <Field label="Valid for (days)" name="days" type="number" min={1} max={maxDays} defaultValue={defaultDays} hint={`1 to ${maxDays} days.`} errors={state.fieldErrors?.days} />
        <div className="sm:col-span-3">
          <Button type="submit" disabled={pending}>
            {pending ? "Issuing…" : "Issue token"}
          </Button>
        </div>
      </form>
    </div>
  );
}

/** The token, this once: selectable text and a copy button (the clipboard may be closed to a plain-http page). */
function IssuedToken({ issued }: { issued: NonNullable<IssuedTokenState["issued"]> }) {
  const [copied, setCopied] = useState<"no" | "yes" | "select">("no");
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(issued.token);
      setCopied("yes");
    } catch {
      setCopied("select");
    }
  };
  return (
    <Notice tone="done" role="status" title={`Token issued for ${issued.channel}`}>
      <p>
        Copy it now: it is shown only this once and cannot be read back later. Put it in the token file on the cycler PC (“{issued.label}”); it is
        valid until {issued.expiresOn}.
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <input
          aria-label="The new token"
          readOnly
          value={issued.token}
          onFocus={(e) => e.currentTarget.select()}
          className="w-full max-w-xl rounded border border-rule bg-white px-2 py-1.5 font-mono text-sm"
        />
        <Button type="button" variant="secondary" onClick={copy}>
          Copy token
        </Button>
        {copied === "yes" && <span className="text-sm text-meets">Copied.</span>}
        {copied === "select" && <span className="text-sm">This browser does not allow copying here: click the token, then press Ctrl+C.</span>}
      </div>
    </Notice>
  );
}
