import fc from "fast-check";
import type { LogColumns } from "@/lib/analysis/log-columns";

/** Random small logs: strictly increasing irregular time, plausible voltage and current of either sign. */
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
      currentA: Float64Array.from(samples, (s) => s.currentA),
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
