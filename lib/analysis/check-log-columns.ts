import type { AnalysisError } from "./analysis-result";
import type { LogColumns } from "./log-columns";

/** Checks that every column holds at least `length` samples, so index loops stay in bounds. */
export function checkLogColumns(columns: LogColumns): AnalysisError | null {
  const { length } = columns;
  if (!Number.isInteger(length) || length < 0) {
    return { code: "invalid-input", message: `Log length ${length} is not a whole number of samples.` };
  }
  const short = [
    ["time", columns.timeS],
    ["voltage", columns.voltageV],
    ["current", columns.currentA],
    ["temperature", columns.temperatureC],
    ["cycler step", columns.cyclerStep],
  ].find(([, column]) => column !== undefined && (column as Float64Array).length < length);
  if (short) {
    return { code: "invalid-input", message: `The ${String(short[0])} column holds fewer than ${length} samples.` };
  }
  return null;
}
