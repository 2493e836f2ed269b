"use client";

import { Button } from "@/components/ui/button";
import { describeCautionCode } from "@/protocols";
import { toggleAcknowledgement } from "./draft-values";
import { useDraftValue, useUpdateDraft } from "./use-draft-field";

/** The caution codes acknowledged on this draft; each can be withdrawn. */
export function AcknowledgementsList() {
  const codes = useDraftValue<string[] | undefined>("acknowledgedCautions") ?? [];
  const steps = (useDraftValue<{ id?: string; label?: string }[] | undefined>("definition.steps") ?? []).map((s) => ({ id: s?.id ?? "", label: s?.label ?? "" }));
  const update = useUpdateDraft();
  return (
    <div className="flex flex-col gap-1 text-sm" aria-labelledby="acknowledged-heading" role="group">
      <h3 id="acknowledged-heading" className="font-bold">
        Acknowledged cautions
      </h3>
      {codes.length === 0 ? (
        <p className="text-ink-soft">
          None. When the preview below flags a set-point outside a cell&apos;s rating, acknowledge it there; the acknowledgement is saved
          with this version.
        </p>
      ) : (
        <ul className="flex flex-col gap-1">
          {codes.map((code) => (
            <li key={code} className="flex flex-wrap items-center gap-2">
              <span aria-hidden="true">⚠</span>
              <span>{describeCautionCode(code, steps)}</span>
              <Button type="button" variant="quiet" aria-label={`Withdraw the acknowledgement: ${describeCautionCode(code, steps)}`} onClick={() => update("acknowledgedCautions", toggleAcknowledgement(codes, code, false))}>
                Withdraw
              </Button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
