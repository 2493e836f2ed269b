import { isPlausibleAmbient, PLAUSIBLE_AMBIENT_C } from "@/lib/conformance/plausible-ambient";
import { formatNumber, type ResolvedStep } from "@/protocols";
import { formatRecordedTime } from "./format-recorded-time";

const c = (v: number) => `${formatNumber(v, { maxDecimals: 2 })} °C`;

/** The step's required range in words: "15 °C to 25 °C". */
export function describeStepRange(step: Pick<ResolvedStep, "ambient">): string {
  return `${c(step.ambient.minC)} to ${c(step.ambient.maxC)}`;
}

/** Outside the step's range: the operator is warned at once and asked for a note. */
export function isOutsideStepRange(step: Pick<ResolvedStep, "ambient">, celsius: number): boolean {
  return celsius < step.ambient.minC || celsius > step.ambient.maxC;
}

export type NewReadingCheck = { ok: true; at: string } | { ok: false; fieldErrors: Record<string, string[]> };

/**
 * A reading typed on the step sheet, checked at entry: a value no ambient can take is refused; one
 * outside the step's range needs a note; a reading belongs inside the step (after its start and, once
 * it has ended, entered late with the time it was taken and the reason). Its time is `now` unless
 * entered late.
 */
export function checkNewReading({
  step,
  celsius,
  takenAt,
  lateReason,
  note,
  startedAt,
  endedAt,
  now,
}: {
  step: Pick<ResolvedStep, "ambient">;
  celsius: number;
  takenAt?: string;
  lateReason?: string;
  note?: string;
  startedAt?: string;
  endedAt?: string;
  now: string;
}): NewReadingCheck {
  const errors: Record<string, string[]> = {};
  if (!isPlausibleAmbient(celsius)) {
    errors.readingCelsius = [
      `${c(celsius)} cannot be an ambient temperature (readings lie between ${c(PLAUSIBLE_AMBIENT_C.min)} and ${c(PLAUSIBLE_AMBIENT_C.max)}); check the thermometer and type the value again`,
    ];
    return { ok: false, fieldErrors: errors };
  }
  if (isOutsideStepRange(step, celsius) && !note) {
    errors.readingNote = [`${c(celsius)} is outside this step's range of ${describeStepRange(step)}: say in a note what happened`];
  }
  const at = takenAt ?? now;
  if (!startedAt) {
    errors.readingCelsius = ["mark the start of the step before recording its ambient"];
  } else if (takenAt) {
    if (!lateReason) errors.readingAtReason = ["say why the reading is entered late"];
    if (Date.parse(takenAt) < Date.parse(startedAt)) errors.readingAt = [`the step started at ${formatRecordedTime(startedAt)}; a reading cannot be earlier`];
    else if (endedAt && Date.parse(takenAt) > Date.parse(endedAt)) errors.readingAt = [`the step ended at ${formatRecordedTime(endedAt)}; a reading cannot be later`];
    else if (Date.parse(takenAt) > Date.parse(now)) errors.readingAt = ["a reading cannot be taken in the future"];
  } else if (endedAt && Date.parse(now) > Date.parse(endedAt)) {
    errors.readingAt = [`the step ended at ${formatRecordedTime(endedAt)}: give the time the reading was taken and why it is entered late`];
  }
  return Object.keys(errors).length > 0 ? { ok: false, fieldErrors: errors } : { ok: true, at };
}
