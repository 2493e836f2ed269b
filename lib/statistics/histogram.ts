import { equalIntervalBreaks, max, min } from "simple-statistics";
import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";

export interface HistogramInput {
  values: readonly number[];
  /** Number of equal-width bins; Sturges' rule when left out. */
  binCount?: number;
}

export interface HistogramBin {
  /** Lower edge, included. */
  from: number;
  /** Upper edge, excluded except for the last bin, which includes the maximum. */
  to: number;
  count: number;
}

export interface Histogram {
  bins: HistogramBin[];
  /** How the number of bins was chosen, in words. */
  rule: string;
}

export const maxBinCount = 100;

/** Sturges' rule (H. A. Sturges, "The choice of a class interval", JASA 21, 1926): k = ⌈log₂ n⌉ + 1. */
export function computeSturgesBinCount(n: number): number {
  return Math.ceil(Math.log2(n)) + 1;
}

function findBin(breaks: readonly number[], x: number): number {
  let bin = 0;
  while (bin < breaks.length - 2 && x >= (breaks[bin + 1] as number)) bin++;
  return bin;
}

/**
 * Equal-width histogram from the minimum to the maximum, with simple-statistics' equalIntervalBreaks
 * for the edges. All-equal values give one bin of zero width.
 */
export function histogram(input: HistogramInput): AnalysisResult<Histogram> {
  const { values, binCount } = input;
  if (values.length === 0) return fail("invalid-input", "A histogram needs at least one result; there are none.");
  if (!values.every(Number.isFinite)) return fail("invalid-input", "Every result must be a finite number.");
  if (binCount !== undefined && (!Number.isInteger(binCount) || binCount < 1 || binCount > maxBinCount)) {
    return fail("invalid-input", `The number of bins must be a whole number from 1 to ${maxBinCount} (got ${String(binCount)}).`);
  }
  const low = min(values);
  const high = max(values);
  if (low === high) {
    return succeed({ bins: [{ from: low, to: high, count: values.length }], rule: "one bin: every result is the same" });
  }
  const k = binCount ?? computeSturgesBinCount(values.length);
  const rule = binCount === undefined ? `Sturges' rule: k = ⌈log₂ ${values.length}⌉ + 1 = ${k} bins of equal width` : `${k} bins of equal width, as asked`;
  const breaks = equalIntervalBreaks(values, k);
  const bins: HistogramBin[] = breaks.slice(0, -1).map((from, i) => ({ from, to: breaks[i + 1] as number, count: 0 }));
  for (const x of values) (bins[findBin(breaks, x)] as HistogramBin).count++;
  return succeed({ bins, rule });
}
