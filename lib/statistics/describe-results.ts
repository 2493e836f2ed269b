import { max, mean, median, min, sampleStandardDeviation } from "simple-statistics";
import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";

export interface DescribeResultsInput {
  values: readonly number[];
  /** The unit of the values, e.g. "mAh" or "Wh"; `rated` and `minimum` are in the same unit. */
  unit: string;
  /** The rated (datasheet) value: gives the share of results at or above it. */
  rated?: number;
  /** The lower specification limit (e.g. the minimum capacity): gives Cpl. */
  minimum?: number;
}

export interface RatedShare {
  rated: number;
  countAtOrAbove: number;
  /** countAtOrAbove / count, a fraction (1 = all). */
  shareAtOrAbove: number;
}

export interface LowerCapability {
  lowerLimit: number;
  countBelow: number;
  /** (mean − LSL) / (3 s); null when s = 0 (all results equal) and the index is not defined. */
  cpl: number | null;
  formula: string;
  source: string;
  note: string | null;
}

export interface ResultsDescription {
  count: number;
  unit: string;
  mean: number;
  /** Sample standard deviation s (n − 1 in the denominator). */
  standardDeviation: number;
  median: number;
  min: number;
  max: number;
  rated: RatedShare | null;
  capability: LowerCapability | null;
}

export const cplFormula = "Cpl = (mean − LSL) / (3 s)";
export const cplSource = "NIST/SEMATECH e-Handbook of Statistical Methods, §6.1.6 (process capability, one-sided lower limit)";

function checkInput({ values, rated, minimum }: DescribeResultsInput): string | null {
  if (values.length < 2) {
    return `Statistics need at least two results; this group has ${values.length === 0 ? "none" : "only one"}.`;
  }
  if (!values.every(Number.isFinite)) return "Every result must be a finite number.";
  if (rated !== undefined && !Number.isFinite(rated)) return "The rated value must be a finite number.";
  if (minimum !== undefined && !Number.isFinite(minimum)) return "The minimum must be a finite number.";
  return null;
}

function describeCapability(values: readonly number[], average: number, s: number, lowerLimit: number): LowerCapability {
  const countBelow = values.filter((x) => x < lowerLimit).length;
  const defined = s > 0;
  return {
    lowerLimit,
    countBelow,
    cpl: defined ? (average - lowerLimit) / (3 * s) : null,
    formula: cplFormula,
    source: cplSource,
    note: defined ? null : "Cpl is not defined: every result is the same, so s = 0.",
  };
}

/**
 * Count, mean, sample standard deviation, median, minimum and maximum of a set of results (all by
 * simple-statistics), with the share at or above the rated value and the one-sided capability index
 * against a lower limit. Cpl assumes roughly normal results; with few results it is a rough figure.
 */
export function describeResults(input: DescribeResultsInput): AnalysisResult<ResultsDescription> {
  const problem = checkInput(input);
  if (problem) return fail("invalid-input", problem);
  const { values, unit, rated, minimum } = input;
  const average = mean(values);
  const s = sampleStandardDeviation(values);
  const countAtOrAbove = rated === undefined ? 0 : values.filter((x) => x >= rated).length;
  return succeed({
    count: values.length,
    unit,
    mean: average,
    standardDeviation: s,
    median: median(values),
    min: min(values),
    max: max(values),
    rated: rated === undefined ? null : { rated, countAtOrAbove, shareAtOrAbove: countAtOrAbove / values.length },
    capability: minimum === undefined ? null : describeCapability(values, average, s, minimum),
  });
}
