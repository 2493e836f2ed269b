"use client";

import { SigningFields } from "@/components/signatures/signing-fields";
import { ActionAnswer } from "@/components/runs/step-sheet/action-answer";
import { Button } from "@/components/ui/button";
import { TextLink } from "@/components/ui/text-link";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";

/** The release signature: password again (21 CFR 11.200), meaning "approved for use". */
export function ReleaseVersionForm({
  action,
  versionId,
  number,
  code,
  signerName,
  meaningWords,
  procedureHref,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  versionId: string;
  number: number;
  code: string;
  signerName: string;
  meaningWords: string;
  procedureHref: string;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  if (state.ok) {
    return (
      <div className="flex flex-col gap-2">
        <ActionAnswer state={state} />
        <TextLink href={procedureHref}>
          Back to {code}
        </TextLink>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4">
      <input type="hidden" name="versionId" value={versionId} />
      <SigningFields
        idPrefix="release"
        signerName={signerName}
        meaningWords={meaningWords}
        passwordErrors={state.fieldErrors?.password}
        statement={
          <>
            By signing you confirm that you read {code} version {number}, its changes and its acknowledged cautions above, that you did not write or
            submit it, and that operators may run it from now on.
          </>
        }
      />
      <div>
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Signing…" : `Sign and release version ${number}`}
        </Button>
      </div>
      <ActionAnswer state={state} />
    </form>
  );
}
