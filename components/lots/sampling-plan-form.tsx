"use client";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
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

const selectClass = "rounded border border-rule bg-white px-2 py-1.5 aria-[invalid=true]:border-deviates";

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
  const invalid = (k: string) => (err(k)?.length ? true : undefined);
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
        <Field label="Inspection level" name="inspectionLevel" errors={err("inspectionLevel")}>
          <select
            id="field-inspectionLevel"
            name="inspectionLevel"
            defaultValue={initial?.inspectionLevel ?? "II"}
            aria-invalid={invalid("inspectionLevel")}
            aria-describedby="field-inspectionLevel-error"
            className={selectClass}
          >
            {INSPECTION_LEVEL_ORDER.map((level) => (
              <option key={level} value={level}>
                {INSPECTION_LEVEL_WORDS[level]}
              </option>
            ))}
          </select>
        </Field>
        <Field label="AQL (% nonconforming)" name="aql" errors={err("aql")} hint="As agreed with the customer or set by the lab's quality plan.">
          <select
            id="field-aql"
            name="aql"
            defaultValue={initial?.aql ?? ""}
            aria-invalid={invalid("aql")}
            aria-describedby="field-aql-hint field-aql-error"
            className={selectClass}
          >
            <option value="" disabled>
              choose…
            </option>
            {aqlLabels.map((label) => (
              <option key={label} value={label}>
                {label} %
              </option>
            ))}
          </select>
        </Field>
        <div className="md:col-span-2">
          <Field
            label="Acceptance procedure"
            name="acceptanceProcedureId"
            errors={err("acceptanceProcedureId")}
            hint="Its statement of conformity decides each drawn cell."
          >
            <select
              id="field-acceptanceProcedureId"
              name="acceptanceProcedureId"
              defaultValue={initial?.acceptanceProcedureId ?? ""}
              aria-invalid={invalid("acceptanceProcedureId")}
              aria-describedby="field-acceptanceProcedureId-hint field-acceptanceProcedureId-error"
              className={selectClass}
            >
              <option value="">any procedure: each cell&apos;s latest reviewed run</option>
              {procedures.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.code}: {p.title}
                </option>
              ))}
            </select>
          </Field>
        </div>
      </div>
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? "Working out the plan…" : initial ? "Change the plan" : "Set the plan"}
      </Button>
    </form>
  );
}
