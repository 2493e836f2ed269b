"use client";

import { useState } from "react";
import { isPlausibleAmbient } from "@/lib/conformance/plausible-ambient";
import type { ResolvedStep } from "@/protocols";
import { describeStepRange, isOutsideStepRange } from "./check-new-reading";
import { toIso } from "./local-time";
import { SelectField } from "@/components/ui/select-field";

function parseTyped(text: string): number | null {
  const n = Number(text.trim().replace(",", "."));
  return text.trim() && Number.isFinite(n) ? n : null;
}

/**
 * One new ambient reading: refused at once when no ambient can take it, warned at once when outside
 * the step's range (a note is then required), and, once the step has ended, entered late with the
 * time it was taken and why. The server checks the same again.
 */
export function ReadingFields({
  step,
  ambientInstruments,
  stepStarted,
  stepEnded,
  errors: serverErrors,
  answer,
  errorId,
  lateAlways = false,
  defaultTakenLocal = "",
}: {
  step: ResolvedStep;
  ambientInstruments: { identifier: string; label: string }[];
  stepStarted: boolean;
  stepEnded: boolean;
  errors: (key: string) => string | undefined;
  /** The server's latest answer: its reading errors are hidden once the reading is edited after it. */
  answer: unknown;
  errorId: string;
  /** A correction always says when the reading was taken. */
  lateAlways?: boolean;
  /** The "taken at" offered first (a correction offers the time of the reading it replaces). */
  defaultTakenLocal?: string;
}) {
  const [typed, setTyped] = useState("");
  const [takenLocal, setTakenLocal] = useState(defaultTakenLocal);
  const [editedAfter, setEditedAfter] = useState<unknown>(null);
  const errors = (key: string) => (editedAfter === answer ? undefined : serverErrors(key));
  const value = parseTyped(typed);
  const implausible = value !== null && !isPlausibleAmbient(value);
  const outside = value !== null && !implausible && isOutsideStepRange(step, value);
  const late = lateAlways || stepEnded;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col text-sm">
          Reading (°C)
          <input
            name="readingCelsius"
            inputMode="decimal"
            value={typed}
            onChange={(e) => {
              setTyped(e.target.value);
              setEditedAfter(answer);
            }}
            aria-invalid={implausible || errors("readingCelsius") ? true : undefined}
            aria-describedby={errorId}
            className="figures w-28 rounded border border-rule px-2 py-2 aria-[invalid=true]:border-deviates"
          />
        </label>
        <SelectField filter label="Read on" name="readingInstrument" defaultValue={ambientInstruments[0]?.identifier ?? ""}>
          {ambientInstruments.map((i) => (
            <option key={i.identifier} value={i.identifier}>
              {i.label}
            </option>
          ))}
          <option value="">an instrument not on this run</option>
        </SelectField>
        {late && (
          <label className="flex flex-col text-sm">
            Taken at
            <input
              type="datetime-local"
              step={1}
              value={takenLocal}
              onChange={(e) => {
                setTakenLocal(e.target.value);
                setEditedAfter(answer);
              }}
              aria-invalid={errors("readingAt") ? true : undefined}
              className="rounded border border-rule px-2 py-2 aria-[invalid=true]:border-deviates"
            />
            <input type="hidden" name="readingAt" value={toIso(takenLocal)} />
          </label>
        )}
      </div>
      <p className="text-xs text-ink-soft">
        This step&apos;s range: {describeStepRange(step)}.{" "}
        {late
          ? "Give the time the reading was taken (between the step's start and end)."
          : stepStarted
            ? "Saved with the server's time. Record at least one reading per step; add more as the step goes on."
            : "Mark the start of the step first; readings are taken while it runs."}
      </p>
      <p id={errorId} aria-live="polite" className="text-sm text-deviates" data-testid="reading-problem">
        {implausible
          ? `${value} °C cannot be an ambient temperature (readings lie between −60 °C and 150 °C); check the thermometer and type the value again.`
          : errors("readingCelsius")}
      </p>
      {(outside || errors("readingNote")) && (
        <div role="alert" className="rounded border-l-4 border-deviates bg-white px-3 py-2 text-sm" data-testid="reading-outside-range">
          <p className="font-semibold">
            <span aria-hidden="true">⚠ </span>
            {value !== null ? `${value} °C is outside this step's range of ${describeStepRange(step)}.` : "This reading is outside the step's range."}
          </p>
          <label className="mt-1 flex flex-col">
            Note: what happened (required)
            <textarea name="readingNote" rows={2} required={outside} className="rounded border border-rule px-2 py-1.5" />
          </label>
          <p aria-live="polite" className="text-deviates">
            {errors("readingNote")}
          </p>
        </div>
      )}
      {late && !lateAlways && (
        <label className="flex flex-col text-sm">
          Why the reading is entered late
          <textarea name="readingAtReason" rows={2} className="rounded border border-rule px-2 py-1.5" />
          <span aria-live="polite" className="text-deviates">
            {errors("readingAtReason")}
          </span>
        </label>
      )}
      {errors("readingAt") && <p className="text-sm text-deviates">{errors("readingAt")}</p>}
    </div>
  );
}
