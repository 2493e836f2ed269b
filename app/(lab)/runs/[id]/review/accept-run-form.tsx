"use client";

import { ActionAnswer } from "@/components/runs/step-sheet/action-answer";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import type { DeviationItem } from "./deviation-item";
import { SigningFields } from "@/components/signatures/signing-fields";

/**
 * The reviewer's note on each deviating finding, then the signature: password again (21 CFR 11.200)
 * and the meaning in words. The server refuses a deviation left without a note.
 */
export function AcceptRunForm({
  action,
  runId,
  runNumber,
  evaluationId,
  signerName,
  meaningWords,
  deviations,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  runId: string;
  runNumber: string;
  evaluationId: string;
  signerName: string;
  meaningWords: string;
  deviations: DeviationItem[];
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-5">
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="evaluationId" value={evaluationId} />
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 font-semibold">
          Deviating findings {deviations.length > 0 ? `(${deviations.length})` : ""}
        </legend>
        {deviations.length === 0 ? (
          <p className="text-sm">No finding of this evaluation deviates: there is nothing to note before signing.</p>
        ) : (
          <>
            <p className="text-sm text-ink-soft">Write a short note on each: why it does or does not affect the result, and what was done about it.</p>
            <ol className="flex flex-col gap-3" data-testid="deviations">
              {deviations.map((d, i) => {
                const errors = state.fieldErrors?.[`acknowledgements.${i}.note`];
                const id = `note-${i}`;
                return (
                  <li key={d.id} className="rounded border border-rule border-l-4 border-l-deviates bg-white p-3">
                    <input type="hidden" name="findingId" value={d.id} />
                    <p className="text-sm">
                      <span className="text-deviates">
                        <span aria-hidden="true">✕ </span>deviates
                      </span>
                      {d.safety ? " (safety)" : ""} · <strong>{d.where}</strong>: {d.title}
                    </p>
                    <dl className="figures mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-sm">
                      <dt className="text-ink-soft">Expected</dt>
                      <dd>{d.expected}</dd>
                      <dt className="text-ink-soft">Observed</dt>
                      <dd>{d.observed}</dd>
                      <dt className="text-ink-soft">Clause</dt>
                      <dd>{d.clause}</dd>
                    </dl>
                    <label htmlFor={id} className="mt-2 block text-sm font-medium">
                      Your note on this deviation
                    </label>
                    <textarea
                      id={id}
                      name="note"
                      required
                      maxLength={1000}
                      rows={2}
                      aria-invalid={errors ? true : undefined}
                      aria-describedby={`${id}-error`}
                      className="mt-1 w-full rounded border border-rule bg-white px-2 py-1.5 aria-[invalid=true]:border-deviates"
                    />
                    <p id={`${id}-error`} aria-live="polite" className="text-sm text-deviates">
                      {errors?.join(" ")}
                    </p>
                  </li>
                );
              })}
            </ol>
          </>
        )}
      </fieldset>
      <SigningFields
        idPrefix="accept"
        signerName={signerName}
        meaningWords={meaningWords}
        passwordErrors={state.fieldErrors?.password}
        statement={
          <>
            By signing you confirm that you reviewed run {runNumber} — its step records, data log, findings and results — against its procedure,
            {deviations.length > 0 ? " that the notes on its deviations above are yours," : ""} and that you did not operate this run.
          </>
        }
      />
      <div>
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Signing…" : `Sign as reviewed and accept run ${runNumber}`}
        </Button>
      </div>
      <ActionAnswer state={state} />
    </form>
  );
}
