import { logDelimiters, type DecimalSeparator, type LogDelimiter } from "./column-mapping";
import { detectWrongFileType } from "./detect-file-type";
import type { LogImportError } from "./log-import-error";
import { proposeMapping, type MappingProposal } from "./propose-mapping";
import { readNumber, readTimestamp } from "./read-cell";
import { normaliseHeaderCell, splitLine } from "./split-line";

/** How many leading bytes the upload form reads to sniff a log. */
export const sniffBytes = 64 * 1024;

export interface PreviewRow {
  /** Line in the file, counted from 1. */
  line: number;
  cells: string[];
}

/** What the first bytes of a log tell about its layout, and a first guess at the mapping. */
export interface LogSniff {
  hasByteOrderMark: boolean;
  lineEnding: "\n" | "\r\n";
  delimiter: LogDelimiter;
  decimalSeparator: DecimalSeparator;
  /** Lines counted from 1 as a person counts them in the file. */
  headerLine: number;
  dataStartLine: number;
  /** Header names, trimmed, quotes removed. */
  columns: string[];
  /** Lines before the header (cycler, channel, cell and test notes some cyclers write), as text. */
  metadataLines: string[];
  /** The first data rows as text, cut into cells. */
  preview: PreviewRow[];
  proposal: MappingProposal;
}

export type LogSniffResult = { ok: true; value: LogSniff } | { ok: false; error: LogImportError };

interface Layout {
  delimiter: LogDelimiter;
  decimalSeparator: DecimalSeparator;
  /** Index (from 0) of the first line of the run of data lines that reaches the end of the sample. */
  firstData: number;
  dataLines: number;
  cellCount: number;
  numericShare: number;
}

const maxSampleLines = 400;

/**
 * Reads the first bytes of an upload (about `sniffBytes`; pass `isWholeFile` when they are all of it)
 * and finds its layout: file type, byte order mark, delimiter, decimal separator, header line after
 * any metadata lines, column names and a preview. Never throws; a file that is not a text log, or
 * has no rows of numbers, comes back as an error.
 */
export function sniffLog(head: Uint8Array, { previewRows = 20, isWholeFile = false }: { previewRows?: number; isWholeFile?: boolean } = {}): LogSniffResult {
  if (head.length === 0) return refuse({ code: "empty-file", message: "The file is empty (0 bytes)." });
  const wrongType = detectWrongFileType(head);
  if (wrongType) return refuse({ code: "wrong-file-type", message: wrongType });
  const hasByteOrderMark = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf;
  const text = new TextDecoder("utf-8", { fatal: false }).decode(head, { stream: !isWholeFile });

  const pieces = text.split("\n");
  // Without the whole file, the piece after the last line break may be a cut line.
  const complete = isWholeFile ? pieces : pieces.slice(0, -1);
  if (isWholeFile && complete.at(-1) === "") complete.pop();
  const carriageReturns = complete.filter((line) => line.endsWith("\r")).length;
  const lines = complete.slice(0, maxSampleLines).map((line) => (line.endsWith("\r") ? line.slice(0, -1) : line));
  if (lines.every((line) => line.trim() === "")) {
    if (complete.length === 0 && !isWholeFile) {
      return refuse({ code: "line-too-long", message: `The first ${head.length} bytes hold no line break; this does not look like a CSV log.`, line: 1 });
    }
    return refuse({ code: "empty-file", message: "The file holds only blank lines." });
  }

  const layout = findLayout(lines);
  if (!layout) {
    return refuse({
      code: "no-data-rows",
      message: "No rows of numbers were found at the start of the file (delimiters tried: commas, semicolons, tabs). Is this a cycler log?",
    });
  }
  const split = (line: string) => splitLine(line, layout.delimiter) ?? [line];
  const headerIndex = findHeader(lines, layout, split);
  if (headerIndex === null) {
    return refuse({
      code: "header-not-found",
      message: `Line ${layout.firstData + 1} already holds numbers, and no header line above it names the columns. A log needs a header row.`,
      line: layout.firstData + 1,
    });
  }
  const columns = split(lines[headerIndex] as string).map(normaliseHeaderCell);
  const preview: PreviewRow[] = [];
  for (let k = layout.firstData; k < lines.length && preview.length < previewRows; k++) {
    const line = lines[k] as string;
    if (line.trim() !== "") preview.push({ line: k + 1, cells: split(line) });
  }
  const headerLine = headerIndex + 1;
  const dataStartLine = layout.firstData + 1;
  return {
    ok: true,
    value: {
      hasByteOrderMark,
      lineEnding: carriageReturns * 2 > complete.length ? "\r\n" : "\n",
      delimiter: layout.delimiter,
      decimalSeparator: layout.decimalSeparator,
      headerLine,
      dataStartLine,
      columns,
      metadataLines: lines.slice(0, headerIndex),
      preview,
      proposal: proposeMapping({
        columns,
        rows: preview.map((row) => row.cells),
        delimiter: layout.delimiter,
        decimalSeparator: layout.decimalSeparator,
        headerLine,
        dataStartLine,
      }),
    },
  };
}

function refuse(error: LogImportError): LogSniffResult {
  return { ok: false, error };
}

/**
 * Tries each delimiter with each decimal separator it allows, and keeps the one under which the most
 * lines at the end of the sample are rows of numbers with one cell count.
 */
function findLayout(lines: readonly string[]): Layout | null {
  let best: Layout | null = null;
  for (const delimiter of logDelimiters) {
    for (const decimalSeparator of delimiter === "," ? (["."] as const) : ([".", ","] as const)) {
      const layout = measureLayout(lines, delimiter, decimalSeparator);
      if (layout && (!best || isBetter(layout, best))) best = layout;
    }
  }
  return best;
}

function isBetter(a: Layout, b: Layout): boolean {
  if (a.dataLines !== b.dataLines) return a.dataLines > b.dataLines;
  if (a.numericShare !== b.numericShare) return a.numericShare > b.numericShare;
  return a.cellCount > b.cellCount;
}

function measureLayout(lines: readonly string[], delimiter: LogDelimiter, decimalSeparator: DecimalSeparator): Layout | null {
  const decimalComma = decimalSeparator === ",";
  let best: Layout | null = null;
  let run: Layout | null = null;
  let numericCells = 0;
  let allCells = 0;
  // The longest run of lines that are rows of numbers with one cell count (blank lines ignored).
  for (let k = 0; k < lines.length; k++) {
    const line = lines[k] as string;
    if (line.trim() === "") continue;
    const cells = splitLine(line, delimiter);
    const numeric = cells ? cells.filter((c) => !Number.isNaN(readNumber(c, decimalComma)) || !Number.isNaN(readTimestamp(c))).length : 0;
    if (!cells || cells.length < 2 || numeric * 2 < cells.length) {
      run = null;
      continue;
    }
    if (!run || run.cellCount !== cells.length) {
      run = { delimiter, decimalSeparator, firstData: k, dataLines: 0, cellCount: cells.length, numericShare: 0 };
      numericCells = 0;
      allCells = 0;
    }
    run.dataLines++;
    numericCells += numeric;
    allCells += cells.length;
    run.numericShare = numericCells / allCells;
    if (!best || run.dataLines > best.dataLines) best = run;
  }
  return best;
}

/**
 * The header is one of the lines just above the data with the same cell count (a units row may sit
 * between header and data): the one whose names are most recognised, else the nearest to the data.
 */
function findHeader(lines: readonly string[], layout: Layout, split: (line: string) => string[]): number | null {
  let best: number | null = null;
  let bestScore = -1;
  for (let k = layout.firstData - 1; k >= 0; k--) {
    const line = lines[k] as string;
    if (line.trim() === "") continue;
    const cells = split(line);
    if (cells.length !== layout.cellCount) break;
    const draft = proposeMapping({
      columns: cells.map(normaliseHeaderCell),
      rows: [],
      delimiter: layout.delimiter,
      decimalSeparator: layout.decimalSeparator,
      headerLine: k + 1,
      dataStartLine: layout.firstData + 1,
    }).draft;
    const score = [draft.time, draft.voltage, draft.current, draft.temperature, draft.step, draft.capacity].filter(Boolean).length;
    if (score > bestScore) {
      best = k;
      bestScore = score;
    }
  }
  return best;
}
