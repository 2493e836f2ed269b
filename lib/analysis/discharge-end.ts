import type { IndexRange } from "./index-range";
import type { LogColumns } from "./log-columns";

/** What the end of a logged discharge and the log's own resolution tell the capacity budget. */
export interface DischargeLogDetail {
  /** Voltage at the last sample, V. */
  endVoltageV: number;
  /**
   * |dQ/dV| at the end of the discharge, Ah/V: the charge delivered over the last stretch divided by
   * the voltage it fell, i.e. how much Q moves when the point where the discharge stops moves by 1 V.
   * Null when the voltage did not fall over that stretch.
   */
  endSlopeAhPerV: number | null;
  /** One unit of the last decimal the log writes currents with (the log's current resolution), A. */
  currentResolutionA: number | null;
  /** One unit of the last decimal the log writes times with (the log's time resolution), s. */
  timeResolutionS: number | null;
}

/** How many samples before the end the slope is taken over (at least this many, and at least 60 s). */
const END_SAMPLES = 10;
const END_SECONDS = 60;

/**
 * The resolution of a logged column: one unit of its last written decimal (a current logged as
 * 0.6003 A has a resolution of 0.0001 A). Values written with more than 6 decimals (full binary
 * precision) give none: null. Read from the decimal form with 12 significant digits.
 */
export function findResolution(values: ArrayLike<number>, range: IndexRange): number | null {
  let decimals = -1;
  for (let i = range.from; i <= range.to; i++) {
    const text = Number((values[i] as number).toPrecision(12)).toString();
    if (text.includes("e")) continue;
    const dot = text.indexOf(".");
    const d = dot < 0 ? 0 : text.length - dot - 1;
    if (d > decimals) decimals = d;
  }
  // More than 6 decimals: written at (nearly) full precision, no resolution worth a budget line.
  // toFixed keeps 10⁻⁴ as 0.0001 rather than 0.00009999999999999999.
  return decimals < 0 || decimals > 6 ? null : Number((10 ** -decimals).toFixed(decimals));
}

/**
 * The end of a discharge: |dQ/dV| over its last stretch (at least 10 samples and 60 s, trapezoid
 * charge over voltage fallen), and the log's current and time resolution over the discharge.
 */
export function describeDischargeEnd(columns: LogColumns, range: IndexRange): DischargeLogDetail {
  const { timeS: t, currentA: c, voltageV: v } = columns;
  const end = range.to;
  let start = end;
  while (start > range.from && (end - start < END_SAMPLES || (t[end] as number) - (t[start] as number) < END_SECONDS)) start--;
  let chargeAh = 0;
  for (let i = start + 1; i <= end; i++) {
    chargeAh += ((Math.abs(c[i] as number) + Math.abs(c[i - 1] as number)) / 2) * (((t[i] as number) - (t[i - 1] as number)) / 3600);
  }
  const fallV = (v[start] as number) - (v[end] as number);
  return {
    endVoltageV: v[end] as number,
    endSlopeAhPerV: fallV > 0 && chargeAh > 0 ? chargeAh / fallV : null,
    currentResolutionA: findResolution(c, range),
    timeResolutionS: findResolution(t, range),
  };
}
