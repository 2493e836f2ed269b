"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { StepRecord } from "@/lib/conformance";
import type { ActionState } from "@/lib/forms/action-state";
import { formatNumber, type ResolvedStep } from "@/protocols";
import { ActionAnswer } from "./action-answer";
import { toIso, toLocalInput } from "./local-time";
import { listProgrammedFields } from "./programmed-fields";
import { ReadingFields } from "./reading-fields";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

/**
 * Corrects a recorded step without erasing anything: strike a wrong reading and add the right one,
 * replace a set-point or a time. The old entries stay on the sheet, struck through, with the reason.
 */
export function CorrectStepForm({
  action,
  runId,
  step,
  cycle,
  record,
  ambientInstruments,
}: {
  action: Action;
  runId: string;
  step: ResolvedStep;
  cycle: number;
  record: StepRecord;
  ambientInstruments: { identifier: string; label: string }[];
}) {
  const { state, onSubmit, pending } = useFormAction(action);
  const id = useId();
  const [start, setStart] = useState("");
  const [end, setEnd] = useState("");
  const errors = (key: string) => state.fieldErrors?.[key]?.join(" ");
  const fields = listProgrammedFields(step);
  return (
    <details className="rounded border border-dashed border-rule text-sm" data-testid="correct-step">
      <summary className="cursor-pointer px-3 py-2 font-medium text-copper-deep">Correct this step…</summary>
      <form onSubmit={onSubmit} className="flex flex-col gap-3 border-t border-rule px-3 py-3" aria-describedby={`${id}-answer`}>
        <input type="hidden" name="runId" value={runId} />
        <input type="hidden" name="stepId" value={step.id} />
        <input type="hidden" name="cycle" value={cycle} />
        <p className="text-ink-soft">Nothing is erased: what you strike or replace stays on the record, struck through, with your reason.</p>
        {record.ambientReadings.some((r) => !r.struck) && (
          <fieldset className="flex flex-col gap-1">
            <legend className="font-semibold">Strike a wrong reading</legend>
            {record.ambientReadings.map((r, i) =>
              r.struck ? null : (
                <label key={`${r.at}-${i}`} className="flex min-h-11 items-center gap-2">
                  <input type="checkbox" name="strike" value={i} className="size-5 accent-copper" />
                  <span className="figures">
                    Strike {formatNumber(r.celsius, { maxDecimals: 2 })} °C taken at {new Date(r.at).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "long" })}
                  </span>
                </label>
              ),
            )}
            {errors("strike") && <p className="text-deviates">{errors("strike")}</p>}
          </fieldset>
        )}
        <fieldset className="flex flex-col gap-1">
          <legend className="font-semibold">Add the right reading</legend>
          <ReadingFields
            step={step}
            ambientInstruments={ambientInstruments}
            stepStarted={Boolean(record.startedAt)}
            stepEnded={Boolean(record.endedAt)}
            errors={errors}
            answer={state}
            errorId={`${id}-reading`}
            lateAlways
            defaultTakenLocal={toLocalInput(record.ambientReadings.findLast((r) => !r.struck)?.at)}
          />
        </fieldset>
        {fields.length > 0 && (
          <fieldset>
            <legend className="font-semibold">Replace a set-point as programmed (leave blank to keep)</legend>
            <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
              {fields.map((f) => {
                const stored = record.programmed[f.name];
                return (
                  <label key={f.name} className="flex flex-col">
                    {f.label} ({f.unit})
                    <input
                      name={`programmed.${f.name}`}
                      inputMode="decimal"
                      placeholder={stored !== undefined ? `now ${formatNumber(stored / f.toSi, { maxDecimals: 4 })}` : "not recorded"}
                      className="figures rounded border border-rule px-2 py-2"
                    />
                    <span className="text-xs text-deviates">{errors(`programmed.${f.name}`)}</span>
                  </label>
                );
              })}
            </div>
          </fieldset>
        )}
        <fieldset className="flex flex-wrap gap-3">
          <legend className="font-semibold">Replace the start or end time (leave blank to keep)</legend>
          <label className="flex flex-col">
            Started at
            <input type="datetime-local" step={1} value={start} onChange={(e) => setStart(e.target.value)} className="rounded border border-rule px-2 py-2" />
            <input type="hidden" name="startedAt" value={toIso(start)} />
          </label>
          <label className="flex flex-col">
            Ended at
            <input type="datetime-local" step={1} value={end} onChange={(e) => setEnd(e.target.value)} className="rounded border border-rule px-2 py-2" />
            <input type="hidden" name="endedAt" value={toIso(end)} />
          </label>
          {errors("endedAt") && <p className="basis-full text-deviates">{errors("endedAt")}</p>}
        </fieldset>
        <label className="flex flex-col">
          Reason for the correction (kept with it, in the history and the evidence)
          <textarea name="reason" rows={2} className="rounded border border-rule px-2 py-1.5" />
          <span className="text-deviates">{errors("reason")}</span>
        </label>
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" disabled={pending} className="min-h-11 px-4">
            {pending ? "Saving…" : "Save the correction"}
          </Button>
          <ActionAnswer id={`${id}-answer`} state={state} />
        </div>
      </form>
    </details>
  );
}
