"use client";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { Notice } from "@/components/ui/notice";
import { useFormAction } from "@/components/ui/use-form-action";
import type { ActionState } from "@/lib/forms/action-state";
import { formatNumber } from "@/protocols/format-number";
import { INSPECTION_LEVEL_ORDER, INSPECTION_LEVEL_WORDS } from "./inspection-level-words";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export interface ProcedureChoice {
  id: string;
  code: string;
  title: string;
}


/** The engineer's choice for a lot's plan: inspection level, AQL and the procedure that decides each cell. */
export function SamplingPlanForm({
  action,
  lotId,
  lotSize,
  aqlLabels,
  procedures,
  initial,
}: {
  action: Action;
  lotId: string;
  lotSize: number;
  /** The offered AQL columns as the table heads them ("0.65", "1.0"). */
  aqlLabels: readonly string[];
  procedures: readonly ProcedureChoice[];
  initial: { inspectionLevel: string; aql: string; acceptanceProcedureId: string } | null;
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  const err = (k: string) => state.fieldErrors?.[k];
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sampling plan" className="flex flex-col gap-4 rounded border border-rule bg-white/60 p-4">
      {state.message && (
        <Notice tone={state.ok ? "done" : "problem"} role={state.ok ? "status" : "alert"} title={state.ok ? "Saved" : "Not saved"}>
          {state.message}
        </Notice>
      )}
      <input type="hidden" name="lotId" value={lotId} />
      <p className="text-sm text-ink-soft">
        The lot size is the quantity received, {formatNumber(lotSize)} cells. Inspection starts at normal severity.
      </p>
      <div className="grid gap-3 md:grid-cols-2">
        <SelectField label="Inspection level" name="inspectionLevel" errors={err("inspectionLevel")} defaultValue={initial?.inspectionLevel ?? "II"}>
          {INSPECTION_LEVEL_ORDER.map((level) => (
            <option key={level} value={level}>
              {INSPECTION_LEVEL_WORDS[level]}
            </option>
          ))}
        </SelectField>
        <SelectField label="AQL (% nonconforming)" name="aql" errors={err("aql")} hint="As agreed with the customer or set by the lab's quality plan." defaultValue={initial?.aql ?? ""}>
          <option value="" disabled>
            choose…
          </option>
          {aqlLabels.map((label) => (
            <option key={label} value={label}>
              {label} %
            </option>
          ))}
        </SelectField>
        <div className="md:col-span-2">
          <SelectField
            label="Acceptance procedure"
            name="acceptanceProcedureId"
            errors={err("acceptanceProcedureId")}
            hint="Its statement of conformity decides each drawn cell."
            defaultValue={initial?.acceptanceProcedureId ?? ""}
          >
            <option value="">any procedure: each cell&apos;s latest reviewed run</option>
            {procedures.map((p) => (
              <option key={p.id} value={p.id}>
                {p.code}: {p.title}
              </option>
            ))}
          </SelectField>
        </div>
      </div>
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Working out the plan…" : initial ? "Change the plan" : "Set the plan"}
      </Button>
    </form>
  );
}
