import { z } from "zod";
import { recordedTimeSchema, type AmbientReading, type StepCorrection, type StepRecord, type StepRecordInput } from "@/lib/conformance";
import { visualOutcomes, type ResolvedStep } from "@/protocols";
import { buildObserved } from "./observation-form";
import { checkNewReading } from "./check-new-reading";
import { listProgrammedFields } from "./programmed-fields";

/** Form text that may be left empty (empty → undefined), at most `max` characters. */
export const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { error: `at most ${max} characters` })
    .optional()
    .transform((v) => (v ? v : undefined));

/** A form number that may be left empty; a decimal comma is read as a point. */
export const optionalNumber = z
  .string()
  .trim()
  .optional()
  .transform((v, ctx) => {
    if (!v) return undefined;
    const n = Number(v.replace(",", "."));
    if (!Number.isFinite(n)) {
      ctx.addIssue({ code: "custom", message: "write a number" });
      return z.NEVER;
    }
    return n;
  });

/** Which line of which run a form speaks for. */
export const stepKeySchema = z.object({
  runId: z.uuid(),
  stepId: z.string().trim().min(1).max(100),
  cycle: z.coerce.number<unknown>().int().min(1).max(1000),
});

/** The step form as the browser sends it; set-points arrive in the units the form shows. */
export const stepFormSchema = stepKeySchema.extend({
  readingCelsius: optionalNumber,
  readingInstrument: optionalText(100),
  /** Required when the reading lies outside the step's range. */
  readingNote: optionalText(1000),
  /** The time the reading was taken, when it is entered later (after the step ended). */
  readingAt: recordedTimeSchema.optional().or(z.literal("").transform(() => undefined)),
  readingAtReason: optionalText(1000),
  notes: optionalText(4000),
  completed: z.literal("on").optional(),
  acknowledged: z.array(z.string().trim().min(1).max(200)).max(100).default([]),
  startedAt: recordedTimeSchema.optional().or(z.literal("").transform(() => undefined)),
  endedAt: recordedTimeSchema.optional().or(z.literal("").transform(() => undefined)),
  timeChangeReason: optionalText(1000),
  programmed: z.record(z.string(), optionalNumber).default({}),
  /** Observation readings as typed: mass in g, open-circuit voltage in V, dimensions in mm. */
  observed: z.record(z.string(), optionalNumber).default({}),
  /** Present when the form showed the visual inspection; the ticked outcomes were recorded as none seen. */
  visualShown: z.literal("1").optional(),
  visualNoneSeen: z.array(z.enum(visualOutcomes)).max(visualOutcomes.length).default([]),
  observationChangeReason: optionalText(1000),
});
export type StepForm = z.output<typeof stepFormSchema>;

/** FormData → the plain object stepFormSchema reads: `programmed.<name>` fields and repeated `acknowledged`. */
export function readStepForm(form: FormData): unknown {
  const programmed: Record<string, string> = {};
  const observed: Record<string, string> = {};
  const plain: Record<string, unknown> = {};
  for (const [key, value] of form.entries()) {
    if (typeof value !== "string") continue;
    if (key.startsWith("programmed.")) programmed[key.slice("programmed.".length)] = value;
    else if (key.startsWith("observed.")) observed[key.slice("observed.".length)] = value;
    else if (key !== "acknowledged" && key !== "visualNoneSeen") plain[key] = value;
  }
  const strings = (name: string) => form.getAll(name).filter((v) => typeof v === "string");
  return { ...plain, programmed, observed, acknowledged: strings("acknowledged"), visualNoneSeen: strings("visualNoneSeen") };
}

export type BuiltStepRecord =
  | { ok: true; record: StepRecordInput & { timeChangeReason?: string } }
  | { ok: false; message: string; fieldErrors: Record<string, string[]> };

/**
 * Merges what the operator typed into the step's stored record: a new ambient reading is stamped
 * `now` (the server's clock) or, entered late, with the time it was taken and why; set-points are
 * converted to SI units; a changed start or end is kept as a correction beside the new value; and a
 * tick is refused until the step has its start, end, one counted ambient reading and every caution
 * of the step acknowledged.
 */
export function buildStepRecord({
  step,
  before,
  form,
  cautionCodes,
  now,
  by = "the operator",
}: {
  step: ResolvedStep;
  before: StepRecord | null;
  form: StepForm;
  cautionCodes: readonly string[];
  now: string;
  /** Who records: named in a correction. */
  by?: string;
}): BuiltStepRecord {
  const fieldErrors: Record<string, string[]> = {};
  const programmed: Record<string, number> = {};
  for (const spec of listProgrammedFields(step)) {
    const typed = form.programmed[spec.name];
    if (typed === undefined) continue;
    if (spec.unit !== "°C" && typed <= 0) fieldErrors[`programmed.${spec.name}`] = ["must be greater than 0"];
    else programmed[spec.name] = typed * spec.toSi;
  }
  const ambientReadings: AmbientReading[] = [...(before?.ambientReadings ?? [])];
  const startedAt = form.startedAt ?? before?.startedAt;
  const endedAt = form.endedAt ?? before?.endedAt;
  if (form.readingCelsius !== undefined) {
    const checked = checkNewReading({
      step,
      celsius: form.readingCelsius,
      takenAt: form.readingAt,
      lateReason: form.readingAtReason,
      note: form.readingNote,
      startedAt,
      endedAt,
      now,
    });
    if (checked.ok) {
      ambientReadings.push({
        at: checked.at,
        celsius: form.readingCelsius,
        ...(form.readingInstrument && { instrumentId: form.readingInstrument }),
        ...(form.readingNote && { note: form.readingNote }),
        ...(form.readingAt && form.readingAtReason && { backdatedReason: form.readingAtReason }),
      });
    } else Object.assign(fieldErrors, checked.fieldErrors);
  } else if (form.readingInstrument && ambientReadings.length === 0 && form.completed) {
    fieldErrors.readingCelsius = ["write the temperature you read"];
  }
  const acknowledged = cautionCodes.filter((code) => form.acknowledged.includes(code) || before?.acknowledgedCautionCodes.includes(code));
  if (form.completed) {
    if (!startedAt) fieldErrors.completed = [...(fieldErrors.completed ?? []), "mark the start of the step first"];
    if (!endedAt) fieldErrors.completed = [...(fieldErrors.completed ?? []), "mark the end of the step first"];
    // A typed reading that was refused keeps its own message; otherwise say what the tick needs.
    if (!ambientReadings.some((r) => !r.struck) && form.readingCelsius === undefined) {
      fieldErrors.readingCelsius = ["record at least one ambient reading before ticking the step"];
    }
    if (acknowledged.length < cautionCodes.length) fieldErrors.acknowledged = ["tick “I have read this caution” for every caution of this step"];
  }
  if (startedAt && endedAt && Date.parse(endedAt) < Date.parse(startedAt)) fieldErrors.endedAt = ["the end is before the start"];
  const observation = step.kind === "observe" ? buildObserved({ step, before: before?.observed, form, now, by }) : null;
  if (observation && !observation.ok) Object.assign(fieldErrors, observation.fieldErrors);
  if (Object.keys(fieldErrors).length > 0) return { ok: false, message: "Some fields need attention.", fieldErrors };
  // A changed time keeps the old one, struck through, beside the new (never erased).
  const corrections: StepCorrection[] = [...(before?.corrections ?? []), ...(observation?.ok ? observation.corrections : [])];
  for (const field of ["startedAt", "endedAt"] as const) {
    const was = before?.[field];
    const next = field === "startedAt" ? startedAt : endedAt;
    if (was && next && was !== next) corrections.push({ field, was, now: next, reason: form.timeChangeReason ?? "", at: now, by });
  }
  return {
    ok: true,
    record: {
      stepId: step.id,
      cycle: form.cycle,
      ...(startedAt && { startedAt }),
      ...(endedAt && { endedAt }),
      ambientReadings,
      programmed,
      ...(before?.measured && { measured: before.measured }),
      ...(observation?.ok && observation.observed !== undefined ? { observed: observation.observed } : before?.observed && { observed: before.observed }),
      ...(form.notes && { notes: form.notes }),
      ...(before?.pauseReason && { pauseReason: before.pauseReason }),
      completed: form.completed === "on",
      acknowledgedCautionCodes: acknowledged,
      ...(before?.cautionsAcknowledged && { cautionsAcknowledged: before.cautionsAcknowledged }),
      ...(corrections.length > 0 && { corrections }),
      ...(form.timeChangeReason && { timeChangeReason: form.timeChangeReason }),
    },
  };
}

/**
 * The stored record with its start or end stamped `now`. A time already stamped is changed only
 * through the step form, with a reason; an end needs a start. A step with cautions starts only once
 * every caution is acknowledged: safety comes before the step, not after it.
 */
export function stampStepTime({
  before,
  stepId,
  cycle,
  which,
  now,
  cautionCodes = [],
  acknowledged = [],
  by = "the operator",
}: {
  before: StepRecord | null;
  stepId: string;
  cycle: number;
  which: "start" | "end";
  now: string;
  cautionCodes?: readonly string[];
  acknowledged?: readonly string[];
  by?: string;
}): { ok: true; record: StepRecordInput } | { ok: false; message: string } {
  const base: StepRecordInput = before ?? { stepId, cycle, ambientReadings: [], programmed: {}, completed: false, acknowledgedCautionCodes: [] };
  if (which === "start") {
    if (before?.startedAt) return { ok: false, message: "The start is already marked; change it in the step's times, with a reason." };
    const missing = cautionCodes.filter((c) => !acknowledged.includes(c));
    if (missing.length > 0) {
      return { ok: false, message: `Read the caution${cautionCodes.length === 1 ? "" : "s"} of this step and tick “I have read this caution” before you start it.` };
    }
    const ack = cautionCodes.length > 0 ? { acknowledgedCautionCodes: [...cautionCodes], cautionsAcknowledged: { by, at: now } } : {};
    return { ok: true, record: { ...base, ...ack, startedAt: now } };
  }
  if (!before?.startedAt) return { ok: false, message: "Mark the start of the step before its end." };
  if (before.endedAt) return { ok: false, message: "The end is already marked; change it in the step's times, with a reason." };
  return { ok: true, record: { ...base, endedAt: now } };
}
