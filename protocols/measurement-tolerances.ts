import { z } from 'zod';
import { explainTypeError } from './explain-type-error';

/**
 * Measurement tolerances of IEC 61960-3 clause 4: voltage ±1 %, current ±1 %, temperature ±2 °C,
 * time ±0.1 %, dimensions ±0.1 mm, capacity ±1 %, all sources of error included.
 * Published via IEC 61951-2:2022 clause 4 (identical wording); memory for 61960-3 itself.
 * Held here as the default parameters of every step; a procedure or a step may set its own.
 */
export const clauseFourTolerances = {
  voltagePercent: 1,
  currentPercent: 1,
  temperatureC: 2,
  timePercent: 0.1,
  dimensionMm: 0.1,
  capacityPercent: 1,
} as const;

const requireTolerance = (what: string) =>
  z.number({ error: explainTypeError(`${what} is a number`) }).nonnegative({ error: `${what} must not be negative` });

/** Tolerances of a step's set-points; an absent field falls back to the procedure, then to clause 4. */
export const setPointTolerancesSchema = z.strictObject({
  voltagePercent: requireTolerance('the voltage tolerance').optional(),
  currentPercent: requireTolerance('the current tolerance').optional(),
  temperatureC: requireTolerance('the temperature tolerance').optional(),
  timePercent: requireTolerance('the time tolerance').optional(),
});

export type SetPointTolerances = z.infer<typeof setPointTolerancesSchema>;
export type SetPointToleranceName = keyof SetPointTolerances;
export const setPointToleranceNames = [
  'voltagePercent',
  'currentPercent',
  'temperatureC',
  'timePercent',
] as const satisfies readonly SetPointToleranceName[];
