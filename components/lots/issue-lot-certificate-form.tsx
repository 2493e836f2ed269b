"use client";

import { SigningFields } from "@/components/signatures/signing-fields";
import { ActionAnswer } from "@/components/runs/step-sheet/action-answer";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";

/** The approval signature that issues a lot's certificate, once its sample has decided the lot. */
export function IssueLotCertificateForm({
  action,
  lotId,
  lotIdentifier,
  decisionWords,
  signerName,
  meaningWords,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  lotId: string;
  lotIdentifier: string;
  decisionWords: string;
  signerName: string;
  meaningWords: string;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <form onSubmit={onSubmit} className="flex max-w-3xl flex-col gap-3" aria-label="Sign and issue the lot certificate">
      <input type="hidden" name="lotId" value={lotId} />
      <SigningFields
        idPrefix="lot-certificate"
        signerName={signerName}
        meaningWords={meaningWords}
        passwordErrors={state.fieldErrors?.password}
        statement={
          <>
            By signing you authorise the certificate of lot {lotIdentifier} for issue: it states the sampling plan, the drawn cells with each run&apos;s
            statement of conformity, and the lot decision ({decisionWords}) with its rule.
          </>
        }
      />
      <div>
        <Button type="submit" disabled={pending || state.ok} className="min-h-11 px-4">
          {pending ? "Signing and issuing…" : "Sign and issue the lot certificate"}
        </Button>
      </div>
      <ActionAnswer state={state} />
    </form>
  );
}
