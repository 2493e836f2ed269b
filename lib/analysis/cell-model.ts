import { fail, succeed, type AnalysisResult } from "./analysis-result";

/** One point of an open-circuit voltage curve. */
export interface OcvPoint {
  /** State of charge, 0 (empty) to 1 (full). */
  soc: number;
  voltageV: number;
}

/**
 * An invented OCV curve shaped like a nickel-rich lithium-ion cell (about 3.0 V empty, 4.2 V full,
 * mean near 3.7 V). Illustrative only: it is no particular cell's data.
 */
export const exampleOcvCurve: readonly OcvPoint[] = [
  { soc: 0, voltageV: 3.0 },
  { soc: 0.03, voltageV: 3.3 },
  { soc: 0.08, voltageV: 3.45 },
  { soc: 0.15, voltageV: 3.53 },
  { soc: 0.3, voltageV: 3.62 },
  { soc: 0.5, voltageV: 3.72 },
  { soc: 0.7, voltageV: 3.88 },
  { soc: 0.85, voltageV: 4.02 },
  { soc: 1, voltageV: 4.2 },
];

/** A cell reduced to what the generator needs: OCV(SoC) plus one series resistance (Thevenin model without the RC branch). */
export interface CellModel {
  capacityMAh: number;
  seriesResistanceOhm: number;
  initialSoc: number;
  ocvCurve?: readonly OcvPoint[];
}

/** OCV as a function of SoC: piecewise linear, extended linearly past both ends so an over-discharge still falls. */
export type OcvFunction = (soc: number) => number;

export function createOcvFunction(curve: readonly OcvPoint[]): AnalysisResult<OcvFunction> {
  if (curve.length < 2) return fail("invalid-input", "An OCV curve needs at least two points.");
  const soc = Float64Array.from(curve, (p) => p.soc);
  const voltage = Float64Array.from(curve, (p) => p.voltageV);
  for (let k = 1; k < curve.length; k++) {
    if (!((soc[k] as number) > (soc[k - 1] as number)) || !((voltage[k] as number) > (voltage[k - 1] as number))) {
      return fail("invalid-input", "OCV curve points must rise in both state of charge and voltage.");
    }
  }
  const last = curve.length - 1;
  return succeed((s: number) => {
    let lo = 0;
    let hi = last;
    if (s <= (soc[1] as number)) hi = 1;
    else if (s >= (soc[last - 1] as number)) lo = last - 1;
    else {
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if ((soc[mid] as number) <= s) lo = mid;
        else hi = mid;
      }
    }
    const s0 = soc[lo] as number;
    const v0 = voltage[lo] as number;
    return v0 + ((s - s0) * ((voltage[hi] as number) - v0)) / ((soc[hi] as number) - s0);
  });
}
