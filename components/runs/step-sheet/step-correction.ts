import { z } from "zod";
import { recordedTimeSchema, type AmbientReading, type StepCorrection, type StepRecord, type StepRecordInput } from "@/lib/conformance";
import type { ResolvedStep } from "@/protocols";
import { checkNewReading } from "./check-new-reading";
import { listProgrammedFields } from "./programmed-fields";
import { optionalNumber, optionalText, stepKeySchema } from "./step-form";

const optionalTime = recordedTimeSchema.optional().or(z.literal("").transform(() => undefined));

/** A correction of a ticked (or any) step as the browser sends it. */
export const correctionFormSchema = stepKeySchema.extend({
  /** Indexes of the readings to strike. */
  strike: z.array(z.coerce.number<unknown>().int().min(0).max(10_000)).max(100).default([]),
  readingCelsius: optionalNumber,
  readingAt: optionalTime,
  readingNote: optionalText(1000),
  readingInstrument: optionalText(100),
  startedAt: optionalTime,
  endedAt: optionalTime,
  programmed: z.record(z.string(), optionalNumber).default({}),
  reason: optionalText(1000),
});
export type CorrectionForm = z.output<typeof correctionFormSchema>;

/** FormData → the object correctionFormSchema reads. */
export function readCorrectionForm(form: FormData): unknown {
  const programmed: Record<string, string> = {};
  const plain: Record<string, unknown> = {};
  for (const [key, value] of form.entries()) {
    if (typeof value !== "string") continue;
    if (key.startsWith("programmed.")) programmed[key.slice("programmed.".length)] = value;
    else if (key !== "strike") plain[key] = value;
  }
  return { ...plain, programmed, strike: form.getAll("strike").filter((v) => typeof v === "string") };
}

export type CorrectedStepRecord =
  | { ok: true; record: StepRecordInput; summary: string[] }
  | { ok: false; message: string; fieldErrors: Record<string, string[]> };

/**
 * Corrects a step's record the way good laboratory records require: nothing is erased. A reading is
 * struck (kept, with who, when and why) and a new one added with the time it was taken; a set-point
 * or a time is replaced and the old value kept beside it as a correction. One reason covers the
 * correction. The tick and the acknowledgements stay as they were.
 */
export function correctStepRecord({
  step,
  before,
  form,
  by,
  now,
}: {
  step: ResolvedStep;
  before: StepRecord;
  form: CorrectionForm;
  by: string;
  now: string;
}): CorrectedStepRecord {
  const fieldErrors: Record<string, string[]> = {};
  const summary: string[] = [];
  const reason = form.reason;
  const struck = { reason: reason ?? "", at: now, by };
  const readings: AmbientReading[] = before.ambientReadings.map((r, i) => {
    if (!form.strike.includes(i) || r.struck) return r;
    summary.push(`struck the reading ${r.celsius} °C taken at ${r.at}`);
    return { ...r, struck };
  });
  const startedAt = form.startedAt ?? before.startedAt;
  const endedAt = form.endedAt ?? before.endedAt;
  if (form.readingCelsius !== undefined) {
    if (!form.readingAt) fieldErrors.readingAt = ["give the time the reading was taken"];
    else {
      const checked = checkNewReading({ step, celsius: form.readingCelsius, takenAt: form.readingAt, lateReason: reason ?? "", note: form.readingNote, startedAt, endedAt, now });
      if (!checked.ok) Object.assign(fieldErrors, checked.fieldErrors);
      else {
        readings.push({
          at: checked.at,
          celsius: form.readingCelsius,
          ...(form.readingInstrument && { instrumentId: form.readingInstrument }),
          ...(form.readingNote && { note: form.readingNote }),
          ...(reason && { backdatedReason: reason }),
        });
        summary.push(`added the reading ${form.readingCelsius} °C taken at ${checked.at}`);
      }
    }
  }
  const corrections: StepCorrection[] = [...(before.corrections ?? [])];
  const programmed = { ...before.programmed };
  for (const spec of listProgrammedFields(step)) {
    const typed = form.programmed[spec.name];
    if (typed === undefined) continue;
    if (spec.unit !== "°C" && typed <= 0) {
      fieldErrors[`programmed.${spec.name}`] = ["must be greater than 0"];
      continue;
    }
    const value = typed * spec.toSi;
    const was = before.programmed[spec.name];
    if (was === value) continue;
    programmed[spec.name] = value;
    corrections.push({ field: `programmed.${spec.name}`, was: was ?? null, now: value, reason: reason ?? "", at: now, by });
    summary.push(`changed ${spec.label.toLowerCase()} to ${typed} ${spec.unit}`);
  }
  for (const field of ["startedAt", "endedAt"] as const) {
    const next = form[field];
    if (!next || next === before[field]) continue;
    corrections.push({ field, was: before[field] ?? null, now: next, reason: reason ?? "", at: now, by });
    summary.push(`changed the ${field === "startedAt" ? "start" : "end"} time`);
  }
  if (startedAt && endedAt && Date.parse(endedAt) < Date.parse(startedAt)) fieldErrors.endedAt = ["the end is before the start"];
  if (before.completed && !readings.some((r) => !r.struck) && !fieldErrors.readingCelsius) {
    fieldErrors.strike = ["a ticked step keeps at least one reading: add the right one while striking the wrong one"];
  }
  if (Object.keys(fieldErrors).length === 0 && summary.length === 0) return { ok: false, message: "Nothing to correct: strike a reading, add one, or change a set-point or a time.", fieldErrors };
  if (!reason) fieldErrors.reason = ["say why the record is corrected (kept with the correction)"];
  if (Object.keys(fieldErrors).length > 0) return { ok: false, message: "Some fields need attention.", fieldErrors };
  return {
    ok: true,
    summary,
    record: {
      ...before,
      ...(startedAt && { startedAt }),
      ...(endedAt && { endedAt }),
      ambientReadings: readings,
      programmed,
      ...(corrections.length > 0 && { corrections }),
    },
  };
}
