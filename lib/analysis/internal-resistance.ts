import { fail, succeed, type AnalysisResult } from "./analysis-result";
import type { IndexRange } from "./index-range";
import type { LogColumns } from "./log-columns";
import { findPulseLevels, type PulseLevelOptions, type PulseLevels } from "./pulse-levels";

/** Two readings of a two-level pulse, currents signed as in LogColumns (discharge negative). */
export interface DcResistanceReadings {
  /** Voltage at the end of the base level, V. */
  u1V: number;
  /** Current at the end of the base level, A. */
  i1A: number;
  /** Voltage at the end of the pulse level, V. */
  u2V: number;
  /** Current at the end of the pulse level, A. */
  i2A: number;
}

/**
 * DC resistance from a two-level pulse, ohms. IEC 61960-3 7.7 writes Rdc = (U1 − U2) / (I2 − I1)
 * with the discharge currents as magnitudes; with signed currents (discharge negative) the same
 * quantity is (U1 − U2) / (I1 − I2), which also holds for a charge pulse.
 */
export function computeDcResistance(readings: DcResistanceReadings): AnalysisResult<number> {
  const { u1V, i1A, u2V, i2A } = readings;
  if (![u1V, i1A, u2V, i2A].every(Number.isFinite)) return fail("invalid-input", "Pulse readings must be numbers.");
  if (i1A === i2A) return fail("invalid-input", "The two current levels are equal, so no resistance follows.");
  return succeed((u1V - u2V) / (i1A - i2A));
}

/** AC resistance Rac = Ua / Ia from rms voltage and rms current at the test frequency (IEC 61960-3 7.7, definition). */
export function computeAcResistance(input: { voltageRmsV: number; currentRmsA: number }): AnalysisResult<number> {
  const { voltageRmsV, currentRmsA } = input;
  if (!Number.isFinite(voltageRmsV) || !(voltageRmsV >= 0)) return fail("invalid-input", "The rms voltage must be zero or more.");
  if (!Number.isFinite(currentRmsA) || !(currentRmsA > 0)) return fail("invalid-input", "The rms current must be above zero.");
  return succeed(voltageRmsV / currentRmsA);
}

export interface DcResistancePulse extends DcResistanceReadings, PulseLevels {
  resistanceOhm: number;
}

/** Finds the pulse in a log slice, reads U1/I1 and U2/I2 at the last sample of each level, and computes Rdc. */
export function evaluateDcResistancePulse(
  columns: LogColumns,
  range: IndexRange,
  options: Partial<PulseLevelOptions> = {},
): AnalysisResult<DcResistancePulse> {
  const levels = findPulseLevels(columns, range, options);
  if (!levels.ok) return levels;
  const { base, pulse } = levels.value;
  const readings = {
    u1V: columns.voltageV[base.to] as number,
    i1A: columns.currentA[base.to] as number,
    u2V: columns.voltageV[pulse.to] as number,
    i2A: columns.currentA[pulse.to] as number,
  };
  const resistance = computeDcResistance(readings);
  if (!resistance.ok) return resistance;
  return succeed({ ...levels.value, ...readings, resistanceOhm: resistance.value });
}
