/**
 * A cycler data log held as columns of typed arrays, in SI units with one sign convention.
 *
 * Typed arrays, not an object per sample: on a 2-million-row log objects cost several times the
 * memory and many times the time to build (see docs/stack.md figures in docs/decisions).
 */
export interface LogColumns {
  /** Elapsed time from the first sample, seconds, strictly increasing. */
  timeS: Float64Array;
  /** Terminal voltage, volts. */
  voltageV: Float64Array;
  /** Current, amperes: positive while charging, negative while discharging. */
  currentA: Float64Array;
  /** Cell or ambient temperature, °C, when the log has it. */
  temperatureC?: Float64Array;
  /** The cycler's own step counter, when the log has it. */
  cyclerStep?: Float64Array;
  /** Number of samples actually filled (arrays may be longer while a log is being read). */
  length: number;
}
