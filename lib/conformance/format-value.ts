import { formatNumber, formatSiValue, type ResolvedTolerance } from "@/protocols";
import type { FindingUnit } from "./finding";

/** A value as findings write it: "0.6 A", "2.50 V", "3 600 s (1 h 0 min)", "23.5 °C", "3 061.2 mAh", "20 mΩ". */
export function formatValue(value: number, unit: FindingUnit): string {
  switch (unit) {
    case "°C":
      return `${formatNumber(value, { minDecimals: 1, maxDecimals: 1 })} °C`;
    case "s":
      return formatSeconds(value);
    case "A":
    case "V":
    case "Ah":
    case "Ω":
      return formatSiValue(value, unit);
    default: {
      const unknown: never = unit;
      throw new Error(`Unknown unit ${String(unknown)}`);
    }
  }
}

/** Seconds, with hours and minutes beside them from one minute up. */
function formatSeconds(seconds: number): string {
  const text = `${formatNumber(seconds, { maxDecimals: 1 })} s`;
  if (!(Math.abs(seconds) >= 60)) return text;
  const wholeMinutes = Math.floor(Math.abs(seconds) / 60);
  const hours = Math.floor(wholeMinutes / 60);
  const minutes = wholeMinutes % 60;
  return `${text} (${hours > 0 ? `${formatNumber(hours)} h ` : ""}${minutes} min)`;
}

/** "0.594 A to 0.606 A". */
export function formatRange(range: { min: number; max: number }, unit: FindingUnit): string {
  return `${formatValue(range.min, unit)} to ${formatValue(range.max, unit)}`;
}

/** "±1 %" or "±0.1 %". */
export function formatPercent(percent: number): string {
  return `±${formatNumber(percent, { maxDecimals: 3 })} %`;
}

/** Plain words for where a tolerance came from, for the finding's clause. */
export function citeTolerance(tolerance: ResolvedTolerance): string {
  switch (tolerance.from) {
    case "IEC 61960-3 clause 4":
      return "IEC 61960-3 clause 4 (tolerances)";
    case "procedure":
      return "tolerance set in the procedure";
    case "step":
      return "tolerance set in the step";
    default: {
      const unknown: never = tolerance.from;
      throw new Error(`Unknown tolerance origin ${String(unknown)}`);
    }
  }
}

/** The procedure's standard and clause, or "the procedure" when the caller did not name them. */
export function citeProcedure(citation: string | null, subject: string): string {
  return citation === null ? `the procedure (${subject})` : `${citation} (${subject}, as set in the procedure)`;
}

/** Requirements of the trade with no single published source (docs/references.md §12). */
export const commonPractice = "common practice";
