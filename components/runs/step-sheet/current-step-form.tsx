"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { useFormAction } from "@/components/ui/use-form-action";
import type { StepRecord } from "@/lib/conformance";
import type { ActionState } from "@/lib/forms/action-state";
import type { ResolvedStep } from "@/protocols";
import { ActionAnswer } from "./action-answer";
import { toIso, toLocalInput } from "./local-time";
import { ReadingFields } from "./reading-fields";
import { listProgrammedFields } from "./programmed-fields";
import { ObservationFields } from "./observation-fields";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export interface StepFormProps {
  action: Action;
  runId: string;
  step: ResolvedStep;
  cycle: number;
  record: StepRecord | null;
  cautions: { code: string; message: string }[];
  /** Thermometers and chambers of the run, by register identifier. */
  ambientInstruments: { identifier: string; label: string }[];
  /** Readings already recorded, in words (formatted on the server, in the lab's zone); struck ones say by whom and why. */
  recordedReadings: { text: string; note: string; struck: string | null }[];
}

function errorsOf(state: ActionState, key: string): string | undefined {
  return state.fieldErrors?.[key]?.join(" ");
}

/** What the operator records for the current line: readings, set-points programmed, notes, cautions, the tick. */
export function CurrentStepForm({ action, runId, step, cycle, record, cautions, ambientInstruments, recordedReadings }: StepFormProps) {
  const { state, onSubmit, pending } = useFormAction(action);
  const id = useId();
  const [editTimes, setEditTimes] = useState(false);
  const [startLocal, setStartLocal] = useState("");
  const [endLocal, setEndLocal] = useState("");
  const fields = listProgrammedFields(step);
  const acknowledged = new Set(record?.acknowledgedCautionCodes ?? []);
  const ackedBy = record?.cautionsAcknowledged;
  const openTimeEditor = (open: boolean) => {
    setEditTimes(open);
    if (open) {
      setStartLocal(toLocalInput(record?.startedAt));
      setEndLocal(toLocalInput(record?.endedAt));
    }
  };
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" aria-describedby={`${id}-answer`} data-testid="current-step-form">
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="stepId" value={step.id} />
      <input type="hidden" name="cycle" value={cycle} />

      {/* Before the start the cautions stand in the start form; after it they say who acknowledged them. */}
      {(record?.startedAt ? cautions : []).map((c) => (
        <div key={c.code} role="group" aria-label="Caution for this step" className="rounded border-l-4 border-copper bg-copper-wash px-4 py-3 text-sm">
          <p className="font-semibold">
            <span aria-hidden="true">⚠ </span>Caution: this step exceeds or approaches the cell&apos;s limits
          </p>
          <p className="mt-1">{c.message}</p>
          {acknowledged.has(c.code) && ackedBy ? (
            <p className="mt-2 font-medium" data-testid="caution-acknowledged">
              <input type="hidden" name="acknowledged" value={c.code} />
              <span aria-hidden="true">☑ </span>Read and acknowledged by {ackedBy.by} at {new Date(ackedBy.at).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "long" })},
              before the step started
            </p>
          ) : (
            <label className="mt-2 flex min-h-11 items-center gap-2 font-medium">
              <input type="checkbox" name="acknowledged" value={c.code} defaultChecked={acknowledged.has(c.code)} className="size-5 accent-copper" />I
              have read this caution
            </label>
          )}
        </div>
      ))}
      {errorsOf(state, "acknowledged") && <p className="text-sm text-deviates">{errorsOf(state, "acknowledged")}</p>}

      <fieldset className="flex flex-col gap-2 rounded border border-rule bg-white p-3">
        <legend className="px-1 text-sm font-semibold">Ambient temperature</legend>
        {recordedReadings.length > 0 && (
          <ul className="figures list-disc pl-5 text-sm" aria-label="Readings recorded" data-testid="recorded-readings">
            {recordedReadings.map((r, i) => (
              <li key={i}>
                {r.struck ? (
                  <>
                    <s data-testid="struck-reading">{r.text}</s> <span className="text-ink-soft">({r.struck})</span>
                  </>
                ) : (
                  r.text
                )}
                {r.note && <span className="text-ink-soft"> · {r.note}</span>}
              </li>
            ))}
          </ul>
        )}
        <ReadingFields
          step={step}
          ambientInstruments={ambientInstruments}
          stepEnded={Boolean(record?.endedAt)}
          stepStarted={Boolean(record?.startedAt)}
          errors={(key) => errorsOf(state, key)}
          answer={state}
          errorId={`${id}-reading-error`}
        />
      </fieldset>

      {fields.length > 0 && (
        <fieldset className="rounded border border-rule bg-white p-3">
          <legend className="px-1 text-sm font-semibold">Set-points as programmed</legend>
          <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
            {fields.map((f) => {
              const stored = record?.programmed[f.name];
              const key = `programmed.${f.name}`;
              return (
                <label key={f.name} className="flex flex-col text-sm">
                  {f.label} ({f.unit})
                  <input
                    name={key}
                    inputMode="decimal"
                    defaultValue={stored !== undefined ? String(stored / f.toSi) : ""}
                    placeholder={f.suggested !== null ? String(Number(f.suggested.toPrecision(6))) : undefined}
                    aria-invalid={errorsOf(state, key) ? true : undefined}
                    className="figures rounded border border-rule px-2 py-2 aria-[invalid=true]:border-deviates"
                  />
                  <span aria-live="polite" className="text-xs text-deviates">
                    {errorsOf(state, key)}
                  </span>
                </label>
              );
            })}
          </div>
        </fieldset>
      )}

      {step.kind === "observe" && <ObservationFields step={step} observed={record?.observed} errors={(key) => errorsOf(state, key)} />}

      <label className="flex flex-col text-sm">
        Notes
        <textarea name="notes" rows={2} defaultValue={record?.notes ?? ""} className="rounded border border-rule bg-white px-2 py-1.5" />
      </label>

      {(record?.startedAt || record?.endedAt) && (
        <div className="flex flex-col gap-2">
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={editTimes} onChange={(e) => openTimeEditor(e.target.checked)} className="size-4 accent-copper" />
            Correct the recorded start or end time
          </label>
          {editTimes && (
            <div className="flex flex-col gap-2 rounded border border-rule bg-white p-3">
              <div className="flex flex-wrap gap-3">
                <label className="flex flex-col text-sm">
                  Started at
                  <input type="datetime-local" step={1} value={startLocal} onChange={(e) => setStartLocal(e.target.value)} className="rounded border border-rule px-2 py-2" />
                </label>
                <label className="flex flex-col text-sm">
                  Ended at
                  <input type="datetime-local" step={1} value={endLocal} onChange={(e) => setEndLocal(e.target.value)} className="rounded border border-rule px-2 py-2" />
                </label>
              </div>
              <input type="hidden" name="startedAt" value={toIso(startLocal)} />
              <input type="hidden" name="endedAt" value={toIso(endLocal)} />
              <label className="flex flex-col text-sm">
                Reason for the change (kept in the audit trail)
                <textarea name="timeChangeReason" rows={2} required className="rounded border border-rule px-2 py-1.5" />
              </label>
              <p aria-live="polite" className="text-sm text-deviates">
                {errorsOf(state, "endedAt")}
              </p>
            </div>
          )}
        </div>
      )}

      <label className="flex min-h-11 items-center gap-3 rounded border border-rule bg-white px-3 py-2 font-medium">
        <input type="checkbox" name="completed" className="size-6 accent-copper" aria-describedby={`${id}-completed-error`} />
        Step carried out: tick it off
      </label>
      <p id={`${id}-completed-error`} aria-live="polite" className="-mt-3 text-sm text-deviates">
        {errorsOf(state, "completed")}
      </p>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} className="min-h-11 px-4">
          {pending ? "Saving…" : "Save the step"}
        </Button>
        <ActionAnswer id={`${id}-answer`} state={state} />
      </div>
    </form>
  );
}
