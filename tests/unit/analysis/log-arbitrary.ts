import fc from "fast-check";
import type { LogColumns } from "@/lib/analysis/log-columns";

/**
 * Random small logs: strictly increasing irregular time, plausible voltage and current of either sign.
 * Currents are kept to a nanoampere, finer than any cycler logs: subnormal doubles (4e-319 A) made the
 * mean voltage E/Q lose its relative precision and failed the unit-scale property on a chance draw.
 */
export const arbitraryLog = fc
  .array(
    fc.record({
      dt: fc.double({ min: 0.01, max: 100, noNaN: true }),
      voltageV: fc.double({ min: 2.5, max: 4.25, noNaN: true }),
      currentA: fc.double({ min: -5, max: 5, noNaN: true }),
    }),
    { minLength: 2, maxLength: 200 },
  )
  .map((samples): LogColumns => {
    let t = 0;
    return {
      timeS: Float64Array.from(samples, (s) => (t += s.dt)),
      voltageV: Float64Array.from(samples, (s) => s.voltageV),
      currentA: Float64Array.from(samples, (s) => Math.round(s.currentA * 1e9) / 1e9),
      length: samples.length,
    };
  });

export function createLog(samples: { t: number; v: number; i: number; temperature?: number }[]): LogColumns {
  const temperatures = samples.map((s) => s.temperature);
  return {
    timeS: Float64Array.from(samples, (s) => s.t),
    voltageV: Float64Array.from(samples, (s) => s.v),
    currentA: Float64Array.from(samples, (s) => s.i),
    ...(temperatures.every((x) => x !== undefined) ? { temperatureC: Float64Array.from(temperatures) } : {}),
    length: samples.length,
  };
}
