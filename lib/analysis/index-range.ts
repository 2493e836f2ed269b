import type { AnalysisError } from "./analysis-result";

/** An inclusive range of sample indexes into a LogColumns. */
export interface IndexRange {
  from: number;
  to: number;
}

/** Checks that [from, to] lies inside the filled part of a log of `length` samples. */
export function checkIndexRange(range: IndexRange, length: number): AnalysisError | null {
  const { from, to } = range;
  if (!Number.isInteger(from) || !Number.isInteger(to)) {
    return { code: "invalid-range", message: `Index range [${from}, ${to}] must use whole numbers.` };
  }
  if (from < 0 || to >= length || from > to) {
    return {
      code: "invalid-range",
      message: `Index range [${from}, ${to}] is outside the log's ${length} samples or reversed.`,
    };
  }
  return null;
}
