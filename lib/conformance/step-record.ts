import { z } from "zod";
import { identifierSchema, visualOutcomes } from "@/protocols";

/**
 * A point in time with its zone (Z or ±hh:mm). A time without a zone is refused: it would be read
 * in the evaluating machine's zone, and the same record would then give different results.
 */
export const recordedTimeSchema = z.iso.datetime({
  offset: true,
  error: "a time is an ISO 8601 date and time with its zone, e.g. 2026-03-02T08:15:00Z",
});

const positive = (what: string) =>
  z.number({ error: `${what} is a number` }).positive({ error: `${what} must be greater than 0` });

const celsius = (what: string) =>
  z.number({ error: `${what} is a number of °C` }).min(-273.15, { error: `${what} is below absolute zero` });

/**
 * An entry struck as an error: it stays in the record (good laboratory records never erase) but no
 * computation counts it. Who struck it, when, and why.
 */
export const strikeSchema = z.strictObject({
  reason: z.string().trim().min(1, { error: "say why the entry is struck" }).max(1000),
  at: recordedTimeSchema,
  by: z.string().trim().min(1).max(200),
});

export const ambientReadingSchema = z.strictObject({
  at: recordedTimeSchema,
  celsius: celsius("a reading"),
  /** The thermometer's identifier in the instrument register. */
  instrumentId: z.string().trim().min(1).max(100).optional(),
  /** The operator's note, required when the reading lies outside the step's range. */
  note: z.string().trim().min(1).max(1000).optional(),
  /** Why the reading was entered later than it was taken (its `at` is the time it was taken). */
  backdatedReason: z.string().trim().min(1).max(1000).optional(),
  struck: strikeSchema.optional(),
});

/**
 * A recorded value replaced by a correction: the old value (`was`) stays visible, struck through,
 * beside the new one. `field` is "startedAt", "endedAt" or "programmed.<set-point>".
 */
export const stepCorrectionSchema = z.strictObject({
  field: z.string().trim().min(1).max(100),
  was: z.union([z.string().max(100), z.number()]).nullable(),
  now: z.union([z.string().max(100), z.number()]).nullable(),
  reason: z.string().trim().min(1, { error: "say why the entry is corrected" }).max(1000),
  at: recordedTimeSchema,
  by: z.string().trim().min(1).max(200),
});

/**
 * The set-points the operator programmed, named as in the resolved step and in SI units:
 * currents in A, voltages in V, durations in s, temperature in °C. `duration` is the programmed
 * length of a rest or soak; `temperature` the chamber set-point of a soak.
 */
export const programmedSetPointsSchema = z.strictObject({
  current: positive("the current").optional(),
  voltage: positive("the voltage").optional(),
  endVoltage: positive("the end voltage").optional(),
  terminationCurrent: positive("the termination current").optional(),
  terminationDuration: positive("the termination time").optional(),
  maxDuration: positive("the maximum duration").optional(),
  duration: positive("the duration").optional(),
  baseCurrent: positive("the base current").optional(),
  baseDuration: positive("the base duration").optional(),
  pulseCurrent: positive("the pulse current").optional(),
  pulseDuration: positive("the pulse duration").optional(),
  temperature: celsius("the temperature").optional(),
});

/** Values read off an instrument during the step, in SI units. */
export const measuredValuesSchema = z.strictObject({
  acResistanceOhm: positive("the AC resistance").optional(),
});

/**
 * What the operator observed on an observation step: balance, voltmeter and caliper readings, and the
 * visual state. `visual.noneSeen` lists the outcomes the operator confirmed as not seen ("no leakage");
 * an outcome missing from a recorded inspection was not confirmed.
 */
export const observedValuesSchema = z.strictObject({
  massG: positive("the mass").optional(),
  openCircuitVoltageV: z.number({ error: "the open-circuit voltage is a number" }).min(0, { error: "the open-circuit voltage cannot be below 0 V" }).optional(),
  dimensionsMm: z
    .strictObject({
      diameterOrThickness: positive("the diameter or thickness").optional(),
      width: positive("the width").optional(),
      height: positive("the height").optional(),
    })
    .optional(),
  visual: z.strictObject({ noneSeen: z.array(z.enum(visualOutcomes)).max(visualOutcomes.length) }).optional(),
});

/** What the operator recorded for one step of one cycle of a run (docs/design.md §3, step record). */
export const stepRecordSchema = z.strictObject({
  stepId: identifierSchema,
  /** Cycle of a repeated block, 1-based; 1 for a step outside the block. */
  cycle: z
    .number({ error: "the cycle is a number" })
    .int({ error: "the cycle is a whole number" })
    .min(1, { error: "cycles count from 1" })
    .max(1000, { error: "at most 1 000 cycles" })
    .default(1),
  startedAt: recordedTimeSchema.optional(),
  endedAt: recordedTimeSchema.optional(),
  ambientReadings: z.array(ambientReadingSchema).max(10_000).default([]),
  programmed: programmedSetPointsSchema.default({}),
  measured: measuredValuesSchema.optional(),
  observed: observedValuesSchema.optional(),
  notes: z.string().max(4000, { error: "notes have at most 4 000 characters" }).optional(),
  /** Why the step started later than the previous one ended, when it did. */
  pauseReason: z.string().trim().min(1).max(1000).optional(),
  /** The operator's tick: the step was carried out. */
  completed: z.boolean({ error: "completed is true or false" }),
  /** Caution codes ("<kind>/<step>/<field>", as the resolution writes them) the operator acknowledged. */
  acknowledgedCautionCodes: z.array(z.string().trim().min(1).max(200)).max(100).default([]),
  /** Who acknowledged the step's cautions, and when (before the step was started). */
  cautionsAcknowledged: z.strictObject({ by: z.string().trim().min(1).max(200), at: recordedTimeSchema }).optional(),
  /** Set-points and times struck and replaced, oldest first. */
  corrections: z.array(stepCorrectionSchema).max(1000).optional(),
});

export type AmbientReading = z.infer<typeof ambientReadingSchema>;
export type StepCorrection = z.infer<typeof stepCorrectionSchema>;
export type ProgrammedSetPoints = z.infer<typeof programmedSetPointsSchema>;
export type ProgrammedField = keyof ProgrammedSetPoints;
export type ObservedValues = z.infer<typeof observedValuesSchema>;
export type StepRecord = z.output<typeof stepRecordSchema>;
/** A step record as stored or typed in, before defaults are filled in. */
export type StepRecordInput = z.input<typeof stepRecordSchema>;
