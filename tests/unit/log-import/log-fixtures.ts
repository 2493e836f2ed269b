import type { LogColumns } from "@/lib/analysis/log-columns";
import { parseLog, type ColumnMapping, type LogParseResult, type LogParserOptions } from "@/lib/analysis/log-import";
import { formatLogCsv, generateSyntheticLog, type CsvFormat, type SyntheticLogOptions } from "@/tests/support/synthetic-log";

const encoder = new TextEncoder();

export function encode(text: string): Uint8Array {
  return encoder.encode(text);
}

/** A small charge, rest, discharge log of an invented 3 000 mAh cell, with temperature. */
export function makeLog({ seed = 1, sampleIntervalS = 20 }: { seed?: number; sampleIntervalS?: number } = {}): LogColumns {
  const options: SyntheticLogOptions = {
    cell: { capacityMAh: 3000, seriesResistanceOhm: 0.03, initialSoc: 0.1 },
    steps: [
      { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.15 },
      { kind: "rest", durationS: 1800 },
      { kind: "discharge", currentA: 0.6, endVoltageV: 3.0 },
    ],
    seed,
    sampleIntervalS,
    temperature: { ambientC: 23, heatingCPerW: 3 },
  };
  const log = generateSyntheticLog(options);
  if (!log.ok) throw new Error(log.error.message);
  return log.value.columns;
}

export function formatCsv(columns: LogColumns, format: Partial<CsvFormat> = {}): string {
  const text = formatLogCsv(columns, format);
  if (!text.ok) throw new Error(text.error.message);
  return text.value;
}

/** The mapping that matches writeLogCsv's own headers for a format. */
export function mapFormat(format: Partial<CsvFormat> = {}, extra: Partial<ColumnMapping> = {}): ColumnMapping {
  const time = format.time ?? { unit: "s" };
  const voltageUnit = format.voltageUnit ?? "V";
  const currentUnit = format.currentUnit ?? "A";
  const columns = format.columns ?? ["time", "cyclerStep", "voltage", "current", "temperature"];
  return {
    time: time.unit === "iso" ? { form: "timestamp", column: "Timestamp" } : { form: "elapsed", column: `Time (${time.unit})`, unit: time.unit },
    voltage: { column: `Voltage (${voltageUnit})`, unit: voltageUnit },
    current: { column: `Current (${currentUnit})`, unit: currentUnit, dischargeSign: format.dischargeCurrent ?? "negative" },
    ...(columns.includes("temperature") ? { temperature: { column: "Temperature (°C)" } } : {}),
    ...(columns.includes("cyclerStep") ? { step: { column: "Step" } } : {}),
    delimiter: format.delimiter ?? ",",
    decimalSeparator: format.decimalSeparator ?? ".",
    headerLine: 1,
    ...extra,
  };
}

export const defaultMapping = mapFormat();

export function parseText(text: string, mapping: ColumnMapping = defaultMapping, options: Partial<LogParserOptions> = {}): LogParseResult {
  return parseLog({ mapping, chunks: [encode(text)], options: { maxBytes: 50 * 2 ** 20, ...options } });
}

/** A parse that must have failed: its error. */
export function expectError(result: LogParseResult) {
  if (result.ok) throw new Error(`expected a refusal, got ${result.rows} rows`);
  return result.error;
}

/** A parse that must have succeeded. */
export function expectParsed(result: LogParseResult) {
  if (!result.ok) throw new Error(`expected a log, got ${result.error.code}: ${result.error.message}`);
  return result;
}

/** Largest absolute difference between two columns of equal length. */
export function maxDifference(a: Float64Array, b: Float64Array): number {
  if (a.length !== b.length) return Number.POSITIVE_INFINITY;
  let worst = 0;
  for (let k = 0; k < a.length; k++) worst = Math.max(worst, Math.abs((a[k] as number) - (b[k] as number)));
  return worst;
}

/** Splits bytes at the given cut points (sorted, deduplicated, inside the array). */
export function splitAt(bytes: Uint8Array, cuts: readonly number[]): Uint8Array[] {
  const points = [...new Set(cuts.map((c) => Math.max(0, Math.min(bytes.length, c))))].sort((a, b) => a - b);
  const chunks: Uint8Array[] = [];
  let from = 0;
  for (const point of points) {
    chunks.push(bytes.subarray(from, point));
    from = point;
  }
  chunks.push(bytes.subarray(from));
  return chunks;
}

export const header = "Time (s),Step,Voltage (V),Current (A),Temperature (°C)";
