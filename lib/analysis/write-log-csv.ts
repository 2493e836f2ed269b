import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { checkLogColumns } from "./check-log-columns";
import type { LogColumns } from "./log-columns";

export type CsvColumn = "time" | "cyclerStep" | "voltage" | "current" | "temperature";

/** Elapsed time in a unit, or wall-clock ISO 8601 timestamps counted from a given start. */
export type CsvTime = { unit: "s" | "min" | "h"; decimals?: number } | { unit: "iso"; startEpochMs: number };

export interface CsvFormat {
  columns: readonly CsvColumn[];
  headers: Partial<Record<CsvColumn, string>>;
  delimiter: "," | ";" | "\t";
  decimalSeparator: "." | ",";
  time: CsvTime;
  voltageUnit: "V" | "mV";
  currentUnit: "A" | "mA";
  /** Sign of a discharging current in the file (LogColumns always has discharge negative). */
  dischargeCurrent: "negative" | "positive";
  decimals: Partial<Record<"voltage" | "current" | "temperature", number>>;
  lineEnding: "\n" | "\r\n";
  rowsPerChunk: number;
}

export const defaultCsvFormat: CsvFormat = {
  columns: ["time", "cyclerStep", "voltage", "current", "temperature"],
  headers: {},
  delimiter: ",",
  decimalSeparator: ".",
  time: { unit: "s" },
  voltageUnit: "V",
  currentUnit: "A",
  dischargeCurrent: "negative",
  decimals: {},
  lineEnding: "\n",
  rowsPerChunk: 10_000,
};

const secondsPer = { s: 1, min: 60, h: 3600 } as const;
const defaultTimeDecimals = { s: 3, min: 5, h: 7 } as const;

type Formatter = (i: number) => string;

/**
 * Writes a log as delimited text in chunks of rows, so a 2-million-row log never has to sit in
 * memory as one string. Column choice, units, delimiter, decimal separator and current sign are
 * configurable; the header row comes first in the first chunk. Every chunk ends with a line ending.
 */
export function writeLogCsv(columns: LogColumns, format: Partial<CsvFormat> = {}): AnalysisResult<Generator<string, void, undefined>> {
  const problem = checkLogColumns(columns);
  if (problem) return { ok: false, error: problem };
  const f: CsvFormat = { ...defaultCsvFormat, ...format };
  const wanted = format.columns ?? defaultCsvFormat.columns.filter((c) => c !== "temperature" || columns.temperatureC);
  const formatProblem = checkCsvFormat(columns, f, wanted);
  if (formatProblem) return fail("invalid-input", formatProblem);

  const formatters = wanted.map((column) => createFormatter(columns, f, column));
  const header = wanted.map((column) => f.headers[column] ?? describeColumn(f, column)).join(f.delimiter);
  const { length } = columns;
  function* chunks(): Generator<string, void, undefined> {
    let text = header + f.lineEnding;
    for (let from = 0; from < length; from += f.rowsPerChunk) {
      const to = Math.min(from + f.rowsPerChunk, length);
      const rows = new Array<string>(to - from);
      for (let i = from; i < to; i++) {
        let row = (formatters[0] as Formatter)(i);
        for (let k = 1; k < formatters.length; k++) row += f.delimiter + (formatters[k] as Formatter)(i);
        rows[i - from] = row;
      }
      yield text + rows.join(f.lineEnding) + f.lineEnding;
      text = "";
    }
    if (length === 0) yield text;
  }
  return succeed(chunks());
}

/** The whole CSV as one string: for small logs and tests. */
export function formatLogCsv(columns: LogColumns, format: Partial<CsvFormat> = {}): AnalysisResult<string> {
  const written = writeLogCsv(columns, format);
  if (!written.ok) return written;
  return succeed(Array.from(written.value).join(""));
}

function checkCsvFormat(columns: LogColumns, f: CsvFormat, wanted: readonly CsvColumn[]): string | null {
  if (wanted.length === 0) return "Choose at least one column.";
  if (wanted.includes("temperature") && !columns.temperatureC) return "The log has no temperature column to write.";
  if (wanted.includes("cyclerStep") && !columns.cyclerStep) return "The log has no cycler step column to write.";
  if (f.delimiter === "," && f.decimalSeparator === ",") return "A decimal comma needs a delimiter other than a comma.";
  if (!Number.isInteger(f.rowsPerChunk) || f.rowsPerChunk < 1) return "Rows per chunk must be a whole number above zero.";
  const decimals = [...Object.values(f.decimals), f.time.unit === "iso" ? 0 : f.time.decimals ?? 0];
  if (!decimals.every((d) => Number.isInteger(d) && d >= 0 && d <= 15)) return "Decimals must be whole numbers from 0 to 15.";
  if (f.time.unit === "iso" && !Number.isFinite(f.time.startEpochMs)) return "ISO timestamps need a start instant.";
  return null;
}

function describeColumn(f: CsvFormat, column: CsvColumn): string {
  switch (column) {
    case "time":
      return f.time.unit === "iso" ? "Timestamp" : `Time (${f.time.unit})`;
    case "cyclerStep":
      return "Step";
    case "voltage":
      return `Voltage (${f.voltageUnit})`;
    case "current":
      return `Current (${f.currentUnit})`;
    case "temperature":
      return "Temperature (°C)";
    default: {
      const unknown: never = column;
      return String(unknown);
    }
  }
}

function createNumberFormatter(decimals: number, decimalSeparator: "." | ","): (x: number) => string {
  const smallest = 0.5 * 10 ** -decimals;
  return (x) => {
    // Values that round to zero print as 0, never as "-0.000".
    const text = (Math.abs(x) < smallest ? 0 : x).toFixed(decimals);
    return decimalSeparator === "." ? text : text.replace(".", ",");
  };
}

function createFormatter(columns: LogColumns, f: CsvFormat, column: CsvColumn): Formatter {
  const { timeS, voltageV, currentA, temperatureC, cyclerStep } = columns;
  switch (column) {
    case "time": {
      const time = f.time;
      if (time.unit === "iso") return (i) => new Date(Math.round(time.startEpochMs + (timeS[i] as number) * 1000)).toISOString();
      const toText = createNumberFormatter(time.decimals ?? defaultTimeDecimals[time.unit], f.decimalSeparator);
      const per = secondsPer[time.unit];
      return (i) => toText((timeS[i] as number) / per);
    }
    case "cyclerStep":
      return (i) => String(cyclerStep?.[i] ?? "");
    case "voltage": {
      const scale = f.voltageUnit === "mV" ? 1000 : 1;
      const toText = createNumberFormatter(f.decimals.voltage ?? (scale === 1 ? 4 : 1), f.decimalSeparator);
      return (i) => toText((voltageV[i] as number) * scale);
    }
    case "current": {
      const scale = (f.currentUnit === "mA" ? 1000 : 1) * (f.dischargeCurrent === "positive" ? -1 : 1);
      const toText = createNumberFormatter(f.decimals.current ?? (f.currentUnit === "A" ? 5 : 2), f.decimalSeparator);
      return (i) => toText((currentA[i] as number) * scale);
    }
    case "temperature": {
      const toText = createNumberFormatter(f.decimals.temperature ?? 2, f.decimalSeparator);
      return (i) => toText(temperatureC?.[i] as number);
    }
    default: {
      const unknown: never = column;
      throw new Error(`Unknown column ${String(unknown)}`);
    }
  }
}
