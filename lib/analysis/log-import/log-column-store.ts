import type { LogColumns } from "../log-columns";
import type { ColumnMapping, MappedRole } from "./column-mapping";
import { readNumber, readTimestamp } from "./read-cell";

/** What stopped a row from being appended (nothing of it is kept). */
export type RowProblem = "none" | "bad-cell" | "time-backwards" | "duplicate-time" | "too-many-rows";

/** Where each mapped role sits in a row of cells (-1 when the mapping has no such column). */
export type RoleIndexes = Record<MappedRole, number>;

export interface LogColumnStore {
  readonly length: number;
  /** Converts one row's cells to SI and appends it; on a problem nothing of the row is kept. */
  append(cells: readonly string[]): RowProblem;
  /** The role whose cell was unreadable in the last `bad-cell` problem. */
  readonly badRole: MappedRole;
  /** The last row's time as stored (the file's unit, or timestamp milliseconds); NaN when empty. */
  readonly lastTime: number;
  /** Forgets rows from `length` on (to redo a block of lines more slowly). */
  truncate(length: number): void;
  /** The filled columns, trimmed to length, time counted from the first sample. */
  finish(): { columns: LogColumns; capacityAh?: Float64Array };
  /** Drops all rows, so a failed import holds no memory and keeps nothing. */
  release(): void;
  /** A copy of rows [from, to) as finish() will give them (time in seconds from the first sample). */
  copyRows(from: number, to: number): LogColumns;
}

const initialCapacity = 1 << 14;
const secondsPerUnit = { s: 1, min: 60, h: 3600 } as const;

/**
 * Columns of Float64Array that double when full: no object per row. Time is stored as written
 * (elapsed in the file's unit, or timestamp milliseconds) so that order and duplicates are judged on
 * the file's own values; it becomes seconds from the first sample only at the end.
 */
export function createLogColumnStore({
  mapping,
  indexes,
  maxRows,
}: {
  mapping: ColumnMapping;
  indexes: RoleIndexes;
  maxRows: number;
}): LogColumnStore {
  const decimalComma = mapping.decimalSeparator === ",";
  const isTimestamp = mapping.time.form === "timestamp";
  // Milli-units are read with the decimal point moved three places, so "3517.9" mV gives the double
  // nearest to 3.5179 V (dividing the double 3517.9 by 1000 can miss it by one unit in the last place).
  const voltageShift = mapping.voltage.unit === "mV" ? 3 : 0;
  const currentShift = mapping.current.unit === "mA" ? 3 : 0;
  const capacityShift = mapping.capacity?.unit === "mAh" ? 3 : 0;
  const dischargePositive = mapping.current.dischargeSign === "positive";
  const { time: ti, voltage: vi, current: ci, temperature: tempi, step: si, capacity: qi } = indexes;

  let capacity = initialCapacity;
  let n = 0;
  let badRole: MappedRole = "time";
  const allocate = (wanted: boolean) => new Float64Array(wanted ? capacity : 0);
  let time = allocate(true);
  let voltage = allocate(true);
  let current = allocate(true);
  let temperature = allocate(tempi >= 0);
  let step = allocate(si >= 0);
  let charge = allocate(qi >= 0);

  const grow = (old: Float64Array<ArrayBuffer>) => {
    if (old.length === 0) return old;
    const grown = new Float64Array(capacity);
    grown.set(old);
    return grown;
  };

  const fail = (role: MappedRole): RowProblem => {
    badRole = role;
    return "bad-cell";
  };

  function append(cells: readonly string[]): RowProblem {
    if (n >= maxRows) return "too-many-rows";
    if (n === capacity) {
      capacity *= 2;
      [time, voltage, current, temperature, step, charge] = [grow(time), grow(voltage), grow(current), grow(temperature), grow(step), grow(charge)];
    }
    const t = isTimestamp ? readTimestamp(cells[ti] as string) : readNumber(cells[ti] as string, decimalComma);
    if (t !== t) return fail("time");
    if (n > 0) {
      const previous = time[n - 1] as number;
      if (t < previous) return "time-backwards";
      if (t === previous) return "duplicate-time";
    }
    const v = readNumber(cells[vi] as string, decimalComma, voltageShift);
    if (v !== v) return fail("voltage");
    const i = readNumber(cells[ci] as string, decimalComma, currentShift);
    if (i !== i) return fail("current");
    if (tempi >= 0) {
      const x = readNumber(cells[tempi] as string, decimalComma);
      if (x !== x) return fail("temperature");
      temperature[n] = x;
    }
    if (si >= 0) {
      const x = readNumber(cells[si] as string, decimalComma);
      if (x !== x) return fail("step");
      step[n] = x;
    }
    if (qi >= 0) {
      const x = readNumber(cells[qi] as string, decimalComma, capacityShift);
      if (x !== x) return fail("capacity");
      charge[n] = x;
    }
    time[n] = t;
    voltage[n] = v;
    // Sign convention of LogColumns: positive while charging.
    current[n] = dischargePositive ? -i : i;
    n++;
    return "none";
  }

  const perUnit = isTimestamp ? 0 : secondsPerUnit[mapping.time.form === "elapsed" ? mapping.time.unit : "s"];
  /** Seconds from the first sample, computed exactly as finish() does, so early copies equal the final columns. */
  function toSeconds(target: Float64Array, source: Float64Array, from: number, to: number): void {
    const first = n > 0 ? (time[0] as number) : 0;
    if (isTimestamp) {
      for (let k = from; k < to; k++) target[k - from] = ((source[k] as number) - first) / 1000;
    } else {
      for (let k = from; k < to; k++) target[k - from] = ((source[k] as number) - first) * perUnit;
    }
  }

  function copyRows(from: number, to: number): LogColumns {
    if (from < 0 || to > n || from > to) throw new RangeError(`Rows ${from}–${to} are not all in the store (it holds ${n}).`);
    const timeS = new Float64Array(to - from);
    toSeconds(timeS, time, from, to);
    const columns: LogColumns = { timeS, voltageV: voltage.slice(from, to), currentA: current.slice(from, to), length: to - from };
    if (tempi >= 0) columns.temperatureC = temperature.slice(from, to);
    if (si >= 0) columns.cyclerStep = step.slice(from, to);
    return columns;
  }

  function finish(): { columns: LogColumns; capacityAh?: Float64Array } {
    // Time in place: the stored values become seconds from the first sample.
    toSeconds(time, time, 0, n);
    // A mostly filled column is handed out as a view (no copy, so no second copy in memory at once);
    // a mostly empty one is copied to its length, so the spare capacity can be freed.
    const keepView = n >= capacity * 0.75;
    const take = (column: Float64Array<ArrayBuffer>) => (keepView ? column.subarray(0, n) : column.slice(0, n));
    const columns: LogColumns = { timeS: take(time), voltageV: take(voltage), currentA: take(current), length: n };
    if (tempi >= 0) columns.temperatureC = take(temperature);
    if (si >= 0) columns.cyclerStep = take(step);
    const capacityAh = qi >= 0 ? take(charge) : undefined;
    time = voltage = current = temperature = step = charge = allocate(false);
    return capacityAh ? { columns, capacityAh } : { columns };
  }

  return {
    get length() {
      return n;
    },
    get badRole() {
      return badRole;
    },
    get lastTime() {
      return n > 0 ? (time[n - 1] as number) : Number.NaN;
    },
    append,
    truncate(length) {
      n = Math.min(n, length);
    },
    finish,
    copyRows,
    release() {
      n = 0;
      capacity = 0;
      time = voltage = current = temperature = step = charge = allocate(false);
    },
  };
}
