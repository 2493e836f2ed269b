import type { ColumnMapping, DecimalSeparator, ElapsedTimeUnit, LogDelimiter, MappedRole, TimeColumn } from "./column-mapping";
import { readNumber, readTimestamp } from "./read-cell";

/** A mapping guessed from header names and the first rows, for the operator to confirm or correct. */
export type MappingDraft = Partial<ColumnMapping> & Pick<ColumnMapping, "delimiter" | "decimalSeparator" | "headerLine">;

export interface MappingProposal {
  draft: MappingDraft;
  /** What the guess rests on, or what the operator must decide, in plain words. */
  notes: string[];
}

interface HeaderName {
  column: string;
  /** Lower-case words of the name without its unit: "test time" for "Test_Time(s)". */
  words: string;
  /** The unit as written in brackets, after a slash or as a last word, lower case; "" if none. */
  unit: string;
}

const timeUnits: Record<string, ElapsedTimeUnit> = { s: "s", sec: "s", secs: "s", second: "s", seconds: "s", min: "min", mins: "min", minute: "min", minutes: "min", h: "h", hr: "h", hrs: "h", hour: "h", hours: "h" };
const elapsedTimeNames = new Set(["time", "test time", "total time", "elapsed time", "elapsed", "run time", "runtime", "t", "time elapsed", "test time elapsed"]);
const timestampNames = /\b(date|datetime|timestamp|date time|absolute time|real time|clock|system time|wall time)\b/;
const voltageNames = new Set(["voltage", "u", "v", "cell voltage", "potential", "volt", "volts", "ecell", "ewe", "terminal voltage", "battery voltage"]);
const currentNames = new Set(["current", "i", "cell current", "amp", "amps", "ampere", "battery current"]);
const stepNames = new Set(["step", "step index", "step no", "step nr", "step number", "step id", "stepindex", "step idx", "ns"]);
const capacityNames = new Set(["capacity", "q", "cap", "charge capacity", "discharge capacity", "capacity total"]);
const bareUnits = new Set(["v", "mv", "a", "ma", "s", "min", "h", "hr", "ah", "mah", "°c", "degc", "c"]);

/** Splits "Current [mA]", "U/V", "Voltage_V" or "Temp (°C)" into words and unit. */
export function readHeaderName(column: string): HeaderName {
  const text = column.trim();
  const bracketed = /^(.*?)[\s_]*[([{]\s*([^)\]}]*?)\s*[)\]}]\s*$/.exec(text);
  const slashed = /^(.*?)\s*\/\s*([^\s/]+)$/.exec(text);
  const suffixed = /^(.*?)[\s_]+([^\s_]+)$/.exec(text);
  let name = text;
  let unit = "";
  if (bracketed) [name, unit] = [bracketed[1] ?? "", bracketed[2] ?? ""];
  else if (slashed) [name, unit] = [slashed[1] ?? "", slashed[2] ?? ""];
  else if (suffixed && bareUnits.has((suffixed[2] ?? "").toLowerCase())) [name, unit] = [suffixed[1] ?? "", suffixed[2] ?? ""];
  const words = name
    .toLowerCase()
    .replace(/[^\p{L}\p{N}]+/gu, " ")
    .trim();
  return { column, words, unit: unit.toLowerCase().replace(/\s+/g, "") };
}

/**
 * Guesses which column holds what, from header names in several plain spellings with units in
 * brackets, and from the values of the first rows where the header says too little.
 */
export function proposeMapping({
  columns,
  rows,
  delimiter,
  decimalSeparator,
  headerLine,
  dataStartLine,
}: {
  columns: readonly string[];
  rows: readonly (readonly string[])[];
  delimiter: LogDelimiter;
  decimalSeparator: DecimalSeparator;
  headerLine: number;
  dataStartLine: number;
}): MappingProposal {
  const names = columns.map(readHeaderName);
  const notes: string[] = [];
  const draft: MappingDraft = { delimiter, decimalSeparator, headerLine, ...(dataStartLine !== headerLine + 1 ? { dataStartLine } : {}) };
  const taken = new Set<string>();
  const pick = (test: (name: HeaderName) => boolean): HeaderName | undefined => {
    const found = names.find((name) => !taken.has(name.column) && test(name));
    if (found) taken.add(found.column);
    return found;
  };
  const values = (column: string) => {
    const at = columns.indexOf(column);
    return rows.map((row) => row[at] ?? "");
  };
  const isTimestampColumn = (name: HeaderName) => {
    const cells = values(name.column).filter((c) => c.trim() !== "");
    return cells.length > 0 && cells.every((c) => !Number.isNaN(readTimestamp(c)));
  };

  const time = proposeTime({ pick, isTimestampColumn, notes });
  if (time) draft.time = time;

  const voltage = pick((n) => voltageNames.has(n.words) || n.words.includes("voltage"));
  if (voltage) {
    let unit: "V" | "mV" = voltage.unit === "mv" ? "mV" : "V";
    if (voltage.unit !== "v" && voltage.unit !== "mv") {
      // A lithium cell sits between about 2 V and 5 V: values in the thousands are millivolts.
      const typical = median(values(voltage.column).map((c) => Math.abs(readNumber(c, decimalSeparator === ","))));
      unit = typical > 100 ? "mV" : "V";
      notes.push(`The header "${voltage.column}" gives no unit; the values suggest ${unit}.`);
    }
    draft.voltage = { column: voltage.column, unit };
  }

  const current = pick((n) => currentNames.has(n.words) || n.words.includes("current"));
  if (current) {
    const unit: "A" | "mA" = current.unit === "ma" ? "mA" : "A";
    if (current.unit !== "a" && current.unit !== "ma") notes.push(`The header "${current.column}" gives no unit; A is assumed. Check it.`);
    draft.current = { column: current.column, unit, dischargeSign: "negative" };
    notes.push("Discharge current is assumed to be written negative. Check it against a discharge step in the preview.");
  }

  const temperature = pick((n) => n.words.includes("temp") || (n.unit === "°c" && n.words !== "") || n.unit === "degc");
  if (temperature) {
    draft.temperature = { column: temperature.column };
    if (temperature.unit !== "" && !["°c", "degc", "c", "℃"].includes(temperature.unit)) {
      notes.push(`The header "${temperature.column}" is in ${temperature.unit}; only °C is read.`);
    }
  }

  const step = pick((n) => stepNames.has(n.words));
  if (step) draft.step = { column: step.column };

  const charge = pick((n) => capacityNames.has(n.words) || n.words.includes("capacity") || n.unit === "ah" || n.unit === "mah");
  if (charge) draft.capacity = { column: charge.column, unit: charge.unit === "mah" ? "mAh" : "Ah" };

  const missing = (["time", "voltage", "current"] as const satisfies readonly MappedRole[]).filter((role) => draft[role] === undefined);
  if (missing.length > 0) notes.push(`No column was recognised for ${missing.join(", ")}: choose it by hand.`);
  return { draft, notes };
}

function proposeTime({
  pick,
  isTimestampColumn,
  notes,
}: {
  pick: (test: (name: HeaderName) => boolean) => HeaderName | undefined;
  isTimestampColumn: (name: HeaderName) => boolean;
  notes: string[];
}): TimeColumn | undefined {
  // Elapsed time is preferred to wall-clock timestamps: it does not jump at a daylight-saving change.
  const isElapsed = (n: HeaderName) =>
    (n.unit === "" || Object.hasOwn(timeUnits, n.unit)) && !/\bstep\b/.test(n.words) && !timestampNames.test(n.words) && !isTimestampColumn(n);
  const elapsed = pick((n) => elapsedTimeNames.has(n.words) && isElapsed(n)) ?? pick((n) => /\btime\b/.test(n.words) && isElapsed(n));
  if (elapsed) {
    const unit = timeUnits[elapsed.unit];
    if (!unit) notes.push(`The header "${elapsed.column}" gives no time unit; seconds are assumed.`);
    return { form: "elapsed", column: elapsed.column, unit: unit ?? "s" };
  }
  const stamped = pick((n) => isTimestampColumn(n) || timestampNames.test(n.words));
  if (stamped) return { form: "timestamp", column: stamped.column };
  return undefined;
}

function median(xs: number[]): number {
  const finite = xs.filter(Number.isFinite).sort((a, b) => a - b);
  return finite.length === 0 ? Number.NaN : (finite[Math.floor(finite.length / 2)] as number);
}
