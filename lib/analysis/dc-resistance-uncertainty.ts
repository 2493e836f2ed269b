import { fail, succeed, type AnalysisResult } from "./analysis-result";
import type { DcResistanceReadings } from "./internal-resistance";
import {
  checkTolerance,
  combineBudget,
  createBudgetRow,
  type Distribution,
  type Tolerance,
  type UncertaintyBudget,
  type UncertaintyBudgetRow,
} from "./uncertainty";

/** A measuring channel's stated accuracy ±(% of reading + % of range), plus its resolution. */
export interface ChannelAccuracy {
  /** Gain-like part, percent of reading. */
  percentOfReading: number;
  /** Offset-like part, percent of the range's full scale (give `range` with it). */
  percentOfRange?: number;
  range?: number;
  /** Smallest step of the reading, in the channel's unit; enters as a rectangular ±resolution/2 (GUM F.2.2.1). */
  resolution?: number;
  distribution?: Distribution;
}

/**
 * How the two readings of a pulse relate:
 * - "same-channel": U1 and U2 (and I1 and I2) are read by one channel on one range seconds apart,
 *   so its gain error is the same for both (fully correlated, r = 1, GUM 5.2.2). In the difference
 *   U1 − U2 the gain errors of the two large readings cancel except for the gain acting on the step
 *   itself: u(U1 − U2) = |u_g(U1) − u_g(U2)| = u_r(gain)·|U1 − U2|. The range (offset) term and the
 *   resolution are kept as independent for each reading: the range term also covers non-linearity
 *   and noise, which need not cancel, so this is the cautious choice.
 * - "independent": every term of each reading is independent. For a 48 mV step on 3.9 V this
 *   inflates u_r(Rdc) to about 66 % with ±1 % voltage limits, which shows why the correlation matters.
 */
export type ReadingCorrelation = "same-channel" | "independent";

/**
 * Uncertainty budget of Rdc = (U1 − U2) / (I1 − I2) (IEC 61960-3 7.7 with signed currents).
 * Relative sensitivities (GUM 5.1.3): ∂ln R/∂ln U1 = U1/(U1 − U2), ∂ln R/∂ln U2 = −U2/(U1 − U2),
 * ∂ln R/∂ln I1 = −I1/(I1 − I2), ∂ln R/∂ln I2 = I2/(I1 − I2); a common voltage gain enters with +1,
 * a common current gain with −1.
 */
export function evaluateDcResistanceUncertainty(input: {
  readings: DcResistanceReadings;
  voltage: ChannelAccuracy;
  current: ChannelAccuracy;
  correlation: ReadingCorrelation;
  coverageFactor?: number;
}): AnalysisResult<UncertaintyBudget> {
  const { u1V, i1A, u2V, i2A } = input.readings;
  const coverageFactor = input.coverageFactor ?? 2;
  if (![u1V, i1A, u2V, i2A].every(Number.isFinite)) return fail("invalid-input", "Pulse readings must be numbers.");
  const stepV = u1V - u2V;
  const stepA = i1A - i2A;
  if (stepV === 0 || stepA === 0) return fail("invalid-input", "The pulse needs a voltage step and a current step.");
  if (!(coverageFactor > 0)) return fail("invalid-input", "The coverage factor must be above zero.");
  for (const channel of [input.voltage, input.current]) {
    const problem = checkChannel(channel);
    if (problem) return fail("invalid-input", problem);
  }

  const rows = [
    ...createChannelRows({
      channel: input.voltage,
      unit: "V",
      names: ["U1", "U2", "U1 − U2"],
      readings: [u1V, u2V],
      sensitivities: [u1V / stepV, -u2V / stepV],
      gainSensitivity: 1,
      correlation: input.correlation,
    }),
    ...createChannelRows({
      channel: input.current,
      unit: "A",
      names: ["I1", "I2", "I1 − I2"],
      readings: [i1A, i2A],
      sensitivities: [-i1A / stepA, i2A / stepA],
      gainSensitivity: -1,
      correlation: input.correlation,
    }),
  ];
  return succeed(combineBudget({ measurand: "DC resistance", value: stepV / stepA, unit: "Ω", rows, coverageFactor }));
}

function checkChannel(channel: ChannelAccuracy): string | null {
  if ((channel.percentOfRange ?? 0) > 0 && channel.range === undefined) return "A percent-of-range accuracy needs the range.";
  const tolerance: Tolerance = {
    form: "percent-of-reading-and-range",
    percentOfReading: channel.percentOfReading,
    percentOfRange: channel.percentOfRange ?? 0,
    range: channel.range ?? 0,
  };
  return checkTolerance(tolerance, channel.distribution) ?? checkTolerance({ form: "absolute", halfWidth: channel.resolution ?? 0 }, undefined);
}

function createChannelRows(input: {
  channel: ChannelAccuracy;
  unit: string;
  names: readonly [string, string, string];
  readings: readonly [number, number];
  sensitivities: readonly [number, number];
  gainSensitivity: number;
  correlation: ReadingCorrelation;
}): UncertaintyBudgetRow[] {
  const { channel, unit, names, readings, sensitivities, correlation } = input;
  const kind = unit === "V" ? "voltage" : "current";
  const rows: UncertaintyBudgetRow[] = [];
  const perReading = (source: string, tolerance: Tolerance, distribution?: Distribution) =>
    [0, 1].map((k) =>
      createBudgetRow({
        quantity: names[k] as string,
        source,
        tolerance,
        distribution,
        reading: readings[k] as number,
        unit,
        sensitivity: sensitivities[k] as number,
      }),
    );
  const rangeTolerance: Tolerance | null =
    (channel.percentOfRange ?? 0) > 0 ? { form: "absolute", halfWidth: ((channel.percentOfRange ?? 0) / 100) * (channel.range ?? 0) } : null;

  switch (correlation) {
    case "same-channel":
      rows.push(
        createBudgetRow({
          quantity: names[2],
          source: `${kind} channel gain, common to both readings (r = 1)`,
          tolerance: { form: "percent-of-reading", percent: channel.percentOfReading },
          distribution: channel.distribution,
          reading: readings[0] - readings[1],
          unit,
          sensitivity: input.gainSensitivity,
        }),
      );
      if (rangeTolerance) rows.push(...perReading(`${kind} channel range term (${channel.percentOfRange} % of ${channel.range} ${unit})`, rangeTolerance, channel.distribution));
      break;
    case "independent":
      rows.push(
        ...perReading(
          `${kind} channel accuracy, reading taken as independent`,
          rangeTolerance
            ? { form: "percent-of-reading-and-range", percentOfReading: channel.percentOfReading, percentOfRange: channel.percentOfRange ?? 0, range: channel.range ?? 0 }
            : { form: "percent-of-reading", percent: channel.percentOfReading },
          channel.distribution,
        ),
      );
      break;
    default: {
      const unknown: never = correlation;
      throw new Error(`Unknown correlation ${String(unknown)}`);
    }
  }
  if ((channel.resolution ?? 0) > 0) rows.push(...perReading(`${kind} resolution`, { form: "absolute", halfWidth: (channel.resolution ?? 0) / 2 }));
  return rows;
}
