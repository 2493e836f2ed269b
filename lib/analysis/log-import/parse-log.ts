import type { LogColumns } from "../log-columns";
import { columnMappingSchema, getDataStartLine, type ColumnMapping } from "./column-mapping";
import { describeLineShape, describeRowProblem } from "./describe-row-problem";
import { detectWrongFileType, fileTypeProbeBytes } from "./detect-file-type";
import { createLogColumnStore, type LogColumnStore, type RoleIndexes } from "./log-column-store";
import { formatLinePlace, type LogImportError, type LogImportErrorCode, type LogImportWarning } from "./log-import-error";
import { readHeaderLine } from "./read-header";
import { splitLine } from "./split-line";
import { createFastRowSplitter, type FastRowSplitter } from "./split-rows-fast";

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
  warnings: LogImportWarning[];
}

export type LogParseResult = ParsedLog | { ok: false; error: LogImportError };

export interface LogParser {
  /** Reads the next bytes of the file. Returns the error once the log is refused (stop sending). */
  push(chunk: Uint8Array): LogImportError | null;
  /** Reads what is left and returns the whole log, or why it was refused. Nothing is kept on refusal. */
  finish(): LogParseResult;
}

const defaultMaxLineChars = 1 << 20;
/** Bytes held back before decoding a ZIP, enough to recognise an Office file by its first entries. */
const headProbeBytes = 4096;

/**
 * A streaming reader of a cycler's CSV log into typed-array columns. Bytes arrive in chunks of any
 * size; lines are framed here, so a line number is known for every message. Blocks of whole lines
 * are split into cells by udsv; a block that udsv cannot account for line by line (blank lines,
 * quotes, a short or long row, a bad value) is read again by a plain line splitter that names the
 * exact line and column of the first problem. Peak memory is the columns plus one block of text.
 */
export function createLogParser(mapping: ColumnMapping, options: LogParserOptions): LogParser {
  const { maxBytes, maxRows = Number.POSITIVE_INFINITY, maxLineChars = defaultMaxLineChars, onProgress } = options;
  if (!(maxBytes >= 0) || !(maxRows >= 0) || !(maxLineChars >= 1)) throw new RangeError("Log parser limits must be positive numbers.");

  const checked = columnMappingSchema.safeParse(mapping);
  let failure: LogImportError | null = checked.success
    ? null
    : {
        code: "invalid-mapping",
        message: `The column mapping is not complete: ${checked.error.issues.map((i) => `${i.path.join(".") || "mapping"}: ${i.message}`).join("; ")}.`,
      };
  const m = checked.success ? checked.data : mapping;
  const delimiter = m.delimiter;
  const dataStartLine = getDataStartLine(m);

  const decoder = new TextDecoder("utf-8", { fatal: false });
  let bytes = 0;
  let headParts: Uint8Array[] | null = [];
  let headLength = 0;
  let nulProbeLeft = fileTypeProbeBytes;
  let tail: string[] = [];
  let tailChars = 0;
  /** Complete lines read so far; the next line is lineNo + 1. */
  let lineNo = 0;
  let sawText = false;
  let header: string[] = [];
  let indexes: RoleIndexes | null = null;
  let store: LogColumnStore | null = null;
  let splitFast: FastRowSplitter | null = null;
  let previousRowLine = 0;
  let firstTime = "";
  let blankLines = 0;
  let firstBlankLine = 0;
  const warnings: LogImportWarning[] = [];
  let result: LogParseResult | null = null;

  function refuse(error: LogImportError): LogImportError {
    failure ??= error;
    store?.release();
    tail = [];
    headParts = null;
    return failure;
  }

  function refuseAt(code: LogImportErrorCode, line: number, text: string, column?: string): false {
    refuse({ code, message: `${formatLinePlace(line, column)}: ${text}`, line, ...(column === undefined ? {} : { column }) });
    return false;
  }

  function push(chunk: Uint8Array): LogImportError | null {
    if (result) throw new Error("The log parser has already finished.");
    if (failure) return failure;
    if (bytes + chunk.length > maxBytes) {
      bytes += chunk.length;
      return refuse({
        code: "too-large",
        message: `The file is larger than the limit of ${formatBytes(maxBytes)}; reading stopped at line ${lineNo + 1}.`,
        line: lineNo + 1,
      });
    }
    bytes += chunk.length;
    if (headParts) {
      // Copied: the caller may reuse its buffer for the next chunk.
      headParts.push(chunk.slice());
      headLength += chunk.length;
      // Eight bytes show any file type; a ZIP's first entries tell an Excel workbook from other archives.
      if (headLength >= 8 && (headLength >= headProbeBytes || !isZipStart(headParts))) readHead();
    } else {
      if (nulProbeLeft > 0) {
        if (chunk.subarray(0, nulProbeLeft).includes(0)) return refuseWrongType(Uint8Array.of(0));
        nulProbeLeft -= chunk.length;
      }
      takeText(decoder.decode(chunk, { stream: true }));
    }
    onProgress?.({ bytes, rows: store?.length ?? 0 });
    return failure;
  }

  function refuseWrongType(head: Uint8Array): LogImportError {
    return refuse({ code: "wrong-file-type", message: detectWrongFileType(head) ?? "This is not a CSV text log." });
  }

  function readHead(): void {
    const parts = headParts ?? [];
    headParts = null;
    const head = new Uint8Array(headLength);
    let at = 0;
    for (const part of parts) {
      head.set(part, at);
      at += part.length;
    }
    if (detectWrongFileType(head) !== null) {
      refuseWrongType(head);
      return;
    }
    nulProbeLeft -= head.length;
    takeText(decoder.decode(head, { stream: true }));
  }

  /** Frames decoded text into whole lines; an unfinished line waits in the tail. */
  function takeText(text: string): void {
    if (failure || text === "") return;
    const lastBreak = text.lastIndexOf("\n");
    if (lastBreak === -1) {
      tail.push(text);
      tailChars += text.length;
      if (tailChars > maxLineChars) refuseAt("line-too-long", lineNo + 1, `the line is longer than ${maxLineChars} characters; this does not look like a CSV log.`);
      return;
    }
    const block = tail.length === 0 ? text.slice(0, lastBreak + 1) : tail.join("") + text.slice(0, lastBreak + 1);
    const rest = text.slice(lastBreak + 1);
    tail = rest === "" ? [] : [rest];
    tailChars = rest.length;
    readBlock(block);
  }

  /** Reads a block of whole lines (it ends with a line break). */
  function readBlock(block: string): void {
    let pos = 0;
    while (!store && pos < block.length && !failure) {
      const end = block.indexOf("\n", pos);
      if (!readLineBeforeData(stripCarriageReturn(block.slice(pos, end)), ++lineNo)) return;
      pos = end + 1;
    }
    if (!store || failure || pos >= block.length) return;
    const data = pos === 0 ? block : block.slice(pos);
    const lineCount = countLineBreaks(data);
    if (data.indexOf('"') === -1 && readBlockFast(data, lineCount)) {
      lineNo += lineCount;
      previousRowLine = lineNo;
      return;
    }
    readBlockByLine(data);
  }

  /** Metadata, the header, and any lines between the header and the data. */
  function readLineBeforeData(line: string, lineNumber: number): boolean {
    const isBlank = line.trim() === "";
    if (!isBlank) sawText = true;
    // A blank header line is only an error once the file turns out to hold text at all.
    if (lineNumber === m.headerLine && isBlank) return true;
    if (lineNumber > m.headerLine && !indexes && !isBlank) return refuseAt("header-not-found", m.headerLine, "the line where the mapping expects the header is blank.");
    if (lineNumber === m.headerLine && !readHeader(line, lineNumber)) return false;
    if (lineNumber > m.headerLine && lineNumber < dataStartLine) {
      warnings.push({ code: "lines-before-data-skipped", line: lineNumber, message: `Line ${lineNumber}, between the header and the data, was skipped.` });
    }
    if (lineNumber === dataStartLine - 1 && indexes) startData(indexes);
    return true;
  }

  function readHeader(line: string, lineNumber: number): boolean {
    const reading = readHeaderLine({ line, lineNumber, mapping: m });
    if (!reading.ok) {
      refuse(reading.error);
      return false;
    }
    ({ header, indexes } = reading);
    warnings.push(...reading.warnings);
    return true;
  }

  function startData(roles: RoleIndexes): void {
    store = createLogColumnStore({ mapping: m, indexes: roles, maxRows });
    splitFast = createFastRowSplitter({ header, delimiter });
  }

  /** udsv splits the block; if its rows do not account for every line, nothing of them is kept. */
  function readBlockFast(block: string, lineCount: number): boolean {
    const rows = store as LogColumnStore;
    const start = rows.length;
    if ((splitFast as FastRowSplitter)(block, lineCount, (row) => rows.append(row) === "none")) {
      if (start === 0 && lineCount > 0) firstTime = firstTimeCell(block);
      return true;
    }
    rows.truncate(start);
    return false;
  }

  function firstTimeCell(block: string): string {
    const end = block.indexOf("\n");
    const cells = splitLine(stripCarriageReturn(block.slice(0, end)), delimiter);
    return (cells?.[(indexes as RoleIndexes).time] ?? "").trim();
  }

  function readBlockByLine(block: string): void {
    let pos = 0;
    while (pos < block.length && !failure) {
      const end = block.indexOf("\n", pos);
      const line = stripCarriageReturn(block.slice(pos, end));
      pos = end + 1;
      readDataLine(line, ++lineNo, false);
    }
  }

  function readDataLine(line: string, lineNumber: number, isUnterminatedLast: boolean): boolean {
    if (line.trim() === "") {
      if (blankLines++ === 0) firstBlankLine = lineNumber;
      return true;
    }
    const split = splitLine(line, delimiter);
    const shapeError = describeLineShape({ cells: split, lineNumber, header, mapping: m, isUnterminatedLast });
    if (shapeError) {
      refuse(shapeError);
      return false;
    }
    // describeLineShape refuses a line that could not be split.
    const cells = split as string[];
    const rows = store as LogColumnStore;
    const roles = indexes as RoleIndexes;
    const problem = rows.append(cells);
    if (problem !== "none") {
      const previousTime = rows.lastTime;
      refuse(describeRowProblem({ problem, badRole: rows.badRole, previousRowLine, previousTime, maxRows, cells, lineNumber, header, indexes: roles, mapping: m }));
      return false;
    }
    if (rows.length === 1) firstTime = (cells[roles.time] as string).trim();
    previousRowLine = lineNumber;
    return true;
  }

  function finish(): LogParseResult {
    if (result) return result;
    result = settle();
    return result;
  }

  function settle(): LogParseResult {
    if (!failure && headParts) {
      if (headLength === 0) return { ok: false, error: refuse({ code: "empty-file", message: "The file is empty (0 bytes)." }) };
      readHead();
    }
    if (!failure) takeText(decoder.decode());
    if (!failure && tail.length > 0) readLastLine(tail.join(""));
    if (failure) return { ok: false, error: failure };
    if (!sawText) return { ok: false, error: refuse({ code: "empty-file", message: "The file holds only blank lines." }) };
    if (!indexes && lineNo >= m.headerLine) {
      const message = `Line ${m.headerLine}: the line where the mapping expects the header is blank.`;
      return { ok: false, error: refuse({ code: "header-not-found", message, line: m.headerLine }) };
    }
    if (!indexes) {
      return {
        ok: false,
        error: refuse({
          code: "header-not-found",
          message: `The file has ${lineNo} lines, but the mapping expects the header on line ${m.headerLine}.`,
          line: m.headerLine,
        }),
      };
    }
    if (!store || store.length === 0) {
      return {
        ok: false,
        error: refuse({ code: "no-data-rows", message: `The file has a header on line ${m.headerLine} but no data rows after it.`, line: m.headerLine }),
      };
    }
    if (blankLines > 0) {
      const where = blankLines === 1 ? `Line ${firstBlankLine} is blank and was` : `${blankLines} blank lines (the first on line ${firstBlankLine}) were`;
      warnings.push({ code: "blank-lines-skipped", line: firstBlankLine, message: `${where} skipped.` });
    }
    const { columns, capacityAh } = store.finish();
    return { ok: true, columns, ...(capacityAh ? { capacityAh } : {}), rows: columns.length, bytes, firstTime, warnings };
  }

  /** The final line when the file does not end with a line break. */
  function readLastLine(text: string): void {
    tail = [];
    const line = stripCarriageReturn(text);
    const lineNumber = ++lineNo;
    if (!store) {
      readLineBeforeData(line, lineNumber);
      return;
    }
    readDataLine(line, lineNumber, true);
  }

  return { push, finish };
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

function stripCarriageReturn(line: string): string {
  return line.charCodeAt(line.length - 1) === 13 ? line.slice(0, -1) : line;
}

function countLineBreaks(text: string): number {
  let count = 0;
  for (let at = text.indexOf("\n"); at !== -1; at = text.indexOf("\n", at + 1)) count++;
  return count;
}

function formatBytes(count: number): string {
  if (count >= 1 << 20) return `${(count / (1 << 20)).toFixed(count % (1 << 20) === 0 ? 0 : 1)} MiB`;
  if (count >= 1 << 10) return `${(count / (1 << 10)).toFixed(count % (1 << 10) === 0 ? 0 : 1)} KiB`;
  return `${count} bytes`;
}

function isZipStart(parts: readonly Uint8Array[]): boolean {
  const first: number[] = [];
  for (const part of parts) {
    for (const byte of part.subarray(0, 2 - first.length)) first.push(byte);
    if (first.length === 2) break;
  }
  return first[0] === 0x50 && first[1] === 0x4b;
}
