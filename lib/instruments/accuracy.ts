import { z } from "zod";
import { INSTRUMENT_KIND_LABELS, type InstrumentKind } from "./instrument-kind";

// An instrument's accuracy specification as its maker or its calibration states it: limits of
// error (±a), read as rectangular distributions by the uncertainty code (lib/analysis/uncertainty.ts).
// Names follow that code's Tolerance: percentOfReading, percentOfRange, range, halfWidth.

const number = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined ? "required" : `${what} is a number`) });
const percent = (what: string) =>
  number(what).nonnegative({ error: `${what} must not be negative` }).max(100, { error: `${what} is at most 100 %` });

/** ±(% of reading + % of range), with the range's full-scale value in the quantity's unit. */
export const readingAndRangeAccuracySchema = z.strictObject({
  percentOfReading: percent("the percent of reading"),
  percentOfRange: percent("the percent of range"),
  range: number("the range").positive({ error: "the range must be greater than 0" }),
});
export type ReadingAndRangeAccuracy = z.infer<typeof readingAndRangeAccuracySchema>;

/** ±a in the quantity's unit (°C for temperature, g for mass). */
export const absoluteAccuracySchema = z.strictObject({
  halfWidth: number("the limit").nonnegative({ error: "the limit must not be negative" }),
});
export type AbsoluteAccuracy = z.infer<typeof absoluteAccuracySchema>;

/** ±ppm of the elapsed time (a time base's rate error). */
export const timeAccuracySchema = z.strictObject({
  ppm: number("the time accuracy").nonnegative({ error: "the time accuracy must not be negative" }).max(1_000_000),
});
export type TimeAccuracy = z.infer<typeof timeAccuracySchema>;

export const accuracySpecificationSchema = z.strictObject({
  /** Range in A. */
  current: readingAndRangeAccuracySchema.optional(),
  /** Range in V. */
  voltage: readingAndRangeAccuracySchema.optional(),
  /** Range in Ω. */
  resistance: readingAndRangeAccuracySchema.optional(),
  /** ±°C. */
  temperature: absoluteAccuracySchema.optional(),
  /** ±g. */
  mass: absoluteAccuracySchema.optional(),
  time: timeAccuracySchema.optional(),
});
export type AccuracySpecification = z.infer<typeof accuracySpecificationSchema>;
export type AccuracyQuantity = keyof AccuracySpecification;

export const ACCURACY_QUANTITIES = ["current", "voltage", "resistance", "temperature", "mass", "time"] as const satisfies readonly AccuracyQuantity[];

/** The unit of a range or a limit; time is stated in ppm of the elapsed time. */
export const ACCURACY_UNITS: Record<AccuracyQuantity, string> = {
  current: "A",
  voltage: "V",
  resistance: "Ω",
  temperature: "°C",
  mass: "g",
  time: "ppm",
};

/**
 * What each kind must state, and what else it may state. A cycler channel's current, voltage and
 * time enter the capacity and energy budgets (docs/design.md §6); the rest measure one quantity each.
 */
export const ACCURACY_BY_KIND: Record<InstrumentKind, { required: readonly AccuracyQuantity[]; optional: readonly AccuracyQuantity[] }> = {
  "cycler-channel": { required: ["current", "voltage", "time"], optional: ["temperature"] },
  thermometer: { required: ["temperature"], optional: [] },
  "climate-chamber": { required: ["temperature"], optional: [] },
  balance: { required: ["mass"], optional: [] },
  "resistance-meter": { required: ["resistance"], optional: ["voltage"] },
};

/** Missing or out-of-place parts of an accuracy specification for a kind, each with its quantity. */
export function findAccuracyProblems(kind: InstrumentKind, accuracy: AccuracySpecification): { quantity: AccuracyQuantity; message: string }[] {
  const rule = ACCURACY_BY_KIND[kind];
  const problems: { quantity: AccuracyQuantity; message: string }[] = [];
  for (const quantity of ACCURACY_QUANTITIES) {
    const given = accuracy[quantity] !== undefined;
    const words = INSTRUMENT_KIND_LABELS[kind];
    if (!given && rule.required.includes(quantity)) problems.push({ quantity, message: `a ${words} states its ${quantity} accuracy` });
    if (given && !rule.required.includes(quantity) && !rule.optional.includes(quantity)) {
      problems.push({ quantity, message: `a ${words} does not measure ${quantity}: leave it empty` });
    }
  }
  return problems;
}
