import type { LogColumns } from "../log-columns";
import { columnMappingSchema, type ColumnMapping } from "./column-mapping";
import { createLineFramer } from "./frame-lines";
import { createLogColumnStore, type LogColumnStore } from "./log-column-store";
import type { LogImportError, LogImportWarning } from "./log-import-error";
import { createDataRows, stripCarriageReturn, type DataRows } from "./read-data-rows";
import { createHeaderLines, type HeaderLines } from "./read-header-lines";

export interface LogProgress {
  bytes: number;
  rows: number;
}

export interface LogParserOptions {
  /** The upload limit: the file is refused as soon as more bytes than this arrive. */
  maxBytes: number;
  /** Refuse a log with more data rows than this. Default: no limit beyond maxBytes. */
  maxRows?: number;
  /** Longest line accepted, in characters. Default 1 MiB: a log line is a few dozen. */
  maxLineChars?: number;
  /** Told after each chunk how far the reading has come. */
  onProgress?: (progress: LogProgress) => void;
  /** Given rows as soon as they are final, `rowsPerPart` at a time (the rest at the end), in SI units like `columns`. */
  onRows?: (part: { first: number; columns: LogColumns }) => void;
  /** Rows per part handed to `onRows`. Default 65 536. */
  rowsPerPart?: number;
}

export interface ParsedLog {
  ok: true;
  /** SI units, time from the first sample, current positive while charging. */
  columns: LogColumns;
  /** The cycler's own capacity column in Ah, when mapped: for cross-checking only. */
  capacityAh?: Float64Array;
  rows: number;
  bytes: number;
  /** The first data row's time cell as written, e.g. the wall-clock start of a timestamped log. */
  firstTime: string;
  /** The header row's column names as written (trimmed), to compare the layout of a log sent in parts. */
  header: string[];
  warnings: LogImportWarning[];
}

export type LogParseResult = ParsedLog | { ok: false; error: LogImportError };

export interface LogParser {
  /** Reads the next bytes of the file. Returns the error once the log is refused (stop sending). */
  push(chunk: Uint8Array): LogImportError | null;
  /** Reads what is left and returns the whole log, or why it was refused. Nothing is kept on refusal. */
  finish(): LogParseResult;
  /** The first data row's time cell as written, once a data row has been read ("" before). */
  readonly firstTime: string;
}

const defaultMaxLineChars = 1 << 20;

/**
 * A streaming reader of a cycler's CSV log into typed-array columns. Bytes arrive in chunks of any
 * size; lines are framed first (frame-lines), so a line number is known for every message; the lines
 * before the data give the header (read-header-lines); data lines go row by row into the column store
 * (read-data-rows, log-column-store). Peak memory is the columns plus one block of text. With
 * `onRows`, every `rowsPerPart` rows are handed out as soon as they are final, so they can be stored
 * while the rest is still being read.
 */
export function createLogParser(mapping: ColumnMapping, options: LogParserOptions): LogParser {
  const { maxBytes, maxRows = Number.POSITIVE_INFINITY, maxLineChars = defaultMaxLineChars, onProgress, onRows, rowsPerPart = 65_536 } = options;
  if (!(maxBytes >= 0) || !(maxRows >= 0) || !(maxLineChars >= 1) || !(rowsPerPart >= 1)) throw new RangeError("Log parser limits must be positive numbers.");

  const checked = columnMappingSchema.safeParse(mapping);
  let failure: LogImportError | null = checked.success
    ? null
    : {
        code: "invalid-mapping",
        message: `The column mapping is not complete: ${checked.error.issues.map((i) => `${i.path.join(".") || "mapping"}: ${i.message}`).join("; ")}.`,
      };
  const m = checked.success ? checked.data : mapping;
  /** Complete lines read so far; the next line is lineNo + 1. */
  let lineNo = 0;
  const warnings: LogImportWarning[] = [];
  let store: LogColumnStore | null = null;
  let rows: DataRows | null = null;
  let handedOut = 0;
  let result: LogParseResult | null = null;

  const isRefused = () => failure !== null;
  function refuse(error: LogImportError): LogImportError {
    failure ??= error;
    store?.release();
    return failure;
  }

  const headerLines = createHeaderLines({ mapping: m, warnings, refuse });
  const framer = createLineFramer({ maxBytes, maxLineChars, nextLine: () => lineNo + 1, isRefused, refuse, onBlock: readBlock });

  function push(chunk: Uint8Array): LogImportError | null {
    if (result) throw new Error("The log parser has already finished.");
    if (failure) return failure;
    framer.push(chunk);
    if (failure) return failure;
    if (store && onRows) handOutWholeParts(store);
    onProgress?.({ bytes: framer.bytes, rows: store?.length ?? 0 });
    return failure;
  }

  /** Reads a block of whole lines (it ends with a line break). */
  function readBlock(block: string): void {
    let pos = 0;
    while (!rows && pos < block.length && !failure) {
      const end = block.indexOf("\n", pos);
      if (!headerLines.read(stripCarriageReturn(block.slice(pos, end)), ++lineNo)) return;
      pos = end + 1;
      if (headerLines.dataStarts) startData();
    }
    if (!rows || failure || pos >= block.length) return;
    lineNo += rows.readBlock(pos === 0 ? block : block.slice(pos), lineNo + 1);
  }

  function startData(): void {
    const { header, indexes } = headerLines.found as NonNullable<HeaderLines["found"]>;
    store = createLogColumnStore({ mapping: m, indexes, maxRows });
    rows = createDataRows({ mapping: m, header, indexes, store, maxRows, isRefused, refuse });
  }

  /** Rows below the store's length are final once a push has been read (only the block being read is ever redone). */
  function handOutWholeParts(s: LogColumnStore): void {
    while (s.length - handedOut >= rowsPerPart) {
      onRows?.({ first: handedOut, columns: s.copyRows(handedOut, handedOut + rowsPerPart) });
      handedOut += rowsPerPart;
    }
  }

  function finish(): LogParseResult {
    if (result) return result;
    result = settle();
    return result;
  }

  function settle(): LogParseResult {
    const last = failure ? "" : framer.end();
    if (last === null) return { ok: false, error: refuse({ code: "empty-file", message: "The file is empty (0 bytes)." }) };
    if (!failure && last !== "") readLastLine(last);
    if (failure) return { ok: false, error: failure };
    if (!headerLines.sawText) return { ok: false, error: refuse({ code: "empty-file", message: "The file holds only blank lines." }) };
    if (!headerLines.found && lineNo >= m.headerLine) {
      const message = `Line ${m.headerLine}: the line where the mapping expects the header is blank.`;
      return { ok: false, error: refuse({ code: "header-not-found", message, line: m.headerLine }) };
    }
    if (!headerLines.found) {
      return {
        ok: false,
        error: refuse({
          code: "header-not-found",
          message: `The file has ${lineNo} lines, but the mapping expects the header on line ${m.headerLine}.`,
          line: m.headerLine,
        }),
      };
    }
    if (!store || !rows || (store as LogColumnStore).length === 0) {
      return {
        ok: false,
        error: refuse({ code: "no-data-rows", message: `The file has a header on line ${m.headerLine} but no data rows after it.`, line: m.headerLine }),
      };
    }
    const blank = (rows as DataRows).blankLinesWarning();
    if (blank) warnings.push(blank);
    const firstTime = (rows as DataRows).firstTime;
    const { columns, capacityAh } = (store as LogColumnStore).finish();
    if (onRows && handedOut < columns.length) onRows({ first: handedOut, columns: sliceColumns(columns, handedOut) });
    return { ok: true, columns, ...(capacityAh ? { capacityAh } : {}), rows: columns.length, bytes: framer.bytes, firstTime, header: (headerLines.found as NonNullable<HeaderLines["found"]>).header.map((h) => h.trim()), warnings };
  }

  /** The final line when the file does not end with a line break. */
  function readLastLine(text: string): void {
    const line = stripCarriageReturn(text);
    const lineNumber = ++lineNo;
    if (!rows) {
      headerLines.read(line, lineNumber);
      if (headerLines.dataStarts && !failure) startData();
      return;
    }
    rows.readLastLine(line, lineNumber);
  }

  return {
    push,
    finish,
    get firstTime() {
      return rows?.firstTime ?? "";
    },
  };
}

function sliceColumns(c: LogColumns, from: number): LogColumns {
  const out: LogColumns = { timeS: c.timeS.subarray(from), voltageV: c.voltageV.subarray(from), currentA: c.currentA.subarray(from), length: c.length - from };
  if (c.temperatureC) out.temperatureC = c.temperatureC.subarray(from);
  if (c.cyclerStep) out.cyclerStep = c.cyclerStep.subarray(from);
  return out;
}

/** Reads a whole log from its chunks (an upload's stream, or one buffer), stopping at the first refusal. */
export function parseLog({
  mapping,
  chunks,
  options,
}: {
  mapping: ColumnMapping;
  chunks: Iterable<Uint8Array>;
  options: LogParserOptions;
}): LogParseResult {
  const parser = createLogParser(mapping, options);
  for (const chunk of chunks) {
    const error = parser.push(chunk);
    if (error) return { ok: false, error };
  }
  return parser.finish();
}

/** The same, for chunks that arrive asynchronously (a web or Node stream of an upload). */
export async function parseLogAsync({
  mapping,
  chunks,
  options,
}: {
  mapping: ColumnMapping;
  chunks: AsyncIterable<Uint8Array>;
  options: LogParserOptions;
}): Promise<LogParseResult> {
  const parser = createLogParser(mapping, options);
  for await (const chunk of chunks) {
    const error = parser.push(chunk);
    if (error) return { ok: false, error };
  }
  return parser.finish();
}
