import type { AmbientReading } from "./step-record";

/**
 * The widest ambient a cell test lab can meet: −60 °C (below the coldest climate-chamber soaks the
 * standards ask for) to 150 °C (above any abuse-test oven). A reading outside it is a slip of the
 * keyboard or a broken thermometer, never an ambient. Common practice, chosen for this product.
 */
export const PLAUSIBLE_AMBIENT_C = { min: -60, max: 150 } as const;

export function isPlausibleAmbient(celsius: number): boolean {
  return Number.isFinite(celsius) && celsius >= PLAUSIBLE_AMBIENT_C.min && celsius <= PLAUSIBLE_AMBIENT_C.max;
}

/** The readings a computation may use: not struck as errors, and physically plausible. */
export function listCountedReadings<R extends Pick<AmbientReading, "celsius" | "struck">>(readings: readonly R[]): R[] {
  return readings.filter((r) => !r.struck && isPlausibleAmbient(r.celsius));
}
