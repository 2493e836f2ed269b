"use client";

import { ActionAnswer } from "@/components/runs/step-sheet/action-answer";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { SigningFields } from "@/components/signatures/signing-fields";

/** The second signature, meaning "approved": the certificate of an accepted run is issued with it. */
export function IssueCertificateForm({
  action,
  runId,
  runNumber,
  signerName,
  meaningWords,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  runId: string;
  runNumber: string;
  signerName: string;
  meaningWords: string;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3">
      <input type="hidden" name="runId" value={runId} />
      <SigningFields
        idPrefix="issue"
        signerName={signerName}
        meaningWords={meaningWords}
        passwordErrors={state.fieldErrors?.password}
        statement={
          <>
            By signing you authorise the certificate of run {runNumber} for issue: it states the results, the deviations with the reviewer&apos;s notes,
            and the statement of conformity under the procedure&apos;s decision rule.
          </>
        }
      />
      <div>
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Signing and issuing…" : "Sign and issue the certificate"}
        </Button>
      </div>
      <ActionAnswer state={state} />
    </form>
  );
}
