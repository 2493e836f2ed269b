import type { ChannelAccuracy } from "@/lib/analysis/dc-resistance-uncertainty";
import type { InputQuantity, Tolerance, UncertaintySource } from "@/lib/analysis/uncertainty";
import type { AccuracyQuantity, AccuracySpecification, ReadingAndRangeAccuracy } from "./accuracy";

/** 1 ppm = 10⁻⁶ = 10⁻⁴ % (definition). */
const PERCENT_PER_PPM = 1e-4;

/** One part of an accuracy specification as the uncertainty code's Tolerance, or null when not stated. */
export function toTolerance(accuracy: AccuracySpecification, quantity: AccuracyQuantity): Tolerance | null {
  switch (quantity) {
    case "current":
    case "voltage":
    case "resistance": {
      const part = accuracy[quantity];
      return part ? { form: "percent-of-reading-and-range", ...part } : null;
    }
    case "temperature":
    case "mass": {
      const part = accuracy[quantity];
      return part ? { form: "absolute", halfWidth: part.halfWidth } : null;
    }
    case "time": {
      const part = accuracy.time;
      return part ? { form: "percent-of-reading", percent: part.ppm * PERCENT_PER_PPM } : null;
    }
    default: {
      const unknown: never = quantity;
      throw new Error(`Unknown quantity ${String(unknown)}`);
    }
  }
}

/** A current or voltage channel for the DC-resistance budget (lib/analysis/dc-resistance-uncertainty.ts). */
export function toChannelAccuracy(part: ReadingAndRangeAccuracy): ChannelAccuracy {
  return { percentOfReading: part.percentOfReading, percentOfRange: part.percentOfRange, range: part.range };
}

const BUDGET_QUANTITIES = ["current", "voltage", "time"] as const satisfies readonly (InputQuantity & AccuracyQuantity)[];

/**
 * The sources an instrument adds to a capacity or energy budget: its current, voltage and time limits,
 * each rectangular (a stated limit ±a, GUM 4.3.7), named after the instrument.
 */
export function listUncertaintySources(input: { accuracy: AccuracySpecification; instrument: string }): UncertaintySource[] {
  return BUDGET_QUANTITIES.flatMap((quantity) => {
    const tolerance = toTolerance(input.accuracy, quantity);
    if (!tolerance) return [];
    // A time base is stated in ppm of the elapsed time; say it so rather than as a percent of reading.
    const statedLimit = quantity === "time" && input.accuracy.time ? `±${input.accuracy.time.ppm} ppm of the elapsed time` : undefined;
    return [
      {
        quantity,
        source: `${input.instrument} ${quantity} accuracy`,
        tolerance,
        distribution: { kind: "rectangular" } as const,
        ...(statedLimit !== undefined && { statedLimit }),
      },
    ];
  });
}
