"use client";

import { useFormContext, useWatch } from "react-hook-form";
import { ProcedurePreview } from "@/components/procedure-preview";
import { toggleAcknowledgement } from "./draft-values";
import { useUpdateDraft } from "./use-draft-field";

/** The preview of the unsaved draft; its "Acknowledge" boxes write the draft's acknowledged cautions. */
export function DraftPreview() {
  const { control } = useFormContext();
  const definition: unknown = useWatch({ control, name: "definition" });
  const acknowledged = (useWatch({ control, name: "acknowledgedCautions" }) as string[] | undefined) ?? [];
  const update = useUpdateDraft();
  return (
    <section aria-labelledby="preview-heading" className="flex flex-col gap-3 border-t border-rule pt-6">
      <h2 id="preview-heading" className="text-lg font-bold">
        Preview on a cell
      </h2>
      <p className="text-sm text-ink-soft">
        Choose a cell specification to see every set-point worked out for it, from the values above as they stand (saved or not).
      </p>
      <ProcedurePreview
        source={{ kind: "draft", definition, acknowledgedCautions: acknowledged }}
        onAcknowledgeChange={(code, yes) => update("acknowledgedCautions", toggleAcknowledgement(acknowledged, code, yes))}
      />
    </section>
  );
}
