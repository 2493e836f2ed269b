import type { ColumnMapping } from "./column-mapping";
import { describeLineShape, describeRowProblem } from "./describe-row-problem";
import type { LogColumnStore, RoleIndexes } from "./log-column-store";
import type { LogImportError, LogImportWarning } from "./log-import-error";
import { splitLine } from "./split-line";
import { createFastRowSplitter } from "./split-rows-fast";

export interface DataRows {
  /** Reads a block of whole data lines (it ends with a line break) whose first line is `firstLine`. Returns its line count. */
  readBlock(block: string, firstLine: number): number;
  /** Reads the file's last line when it has no line break after it; false once refused. */
  readLastLine(line: string, lineNumber: number): boolean;
  /** The first data row's time cell as written. */
  readonly firstTime: string;
  /** The warning about blank lines skipped among the data, if any were. */
  blankLinesWarning(): LogImportWarning | null;
}

/**
 * Data lines into the column store. Blocks are split into cells by udsv; a block that udsv cannot
 * account for line by line (blank lines, quotes, a short or long row, a bad value) is read again by a
 * plain line splitter that names the exact line and column of the first problem.
 */
export function createDataRows({
  mapping,
  header,
  indexes,
  store,
  maxRows,
  isRefused,
  refuse,
}: {
  mapping: ColumnMapping;
  header: string[];
  indexes: RoleIndexes;
  store: LogColumnStore;
  maxRows: number;
  isRefused: () => boolean;
  refuse: (error: LogImportError) => void;
}): DataRows {
  const { delimiter } = mapping;
  const splitFast = createFastRowSplitter({ header, delimiter });
  let previousRowLine = 0;
  let firstTime = "";
  let blankLines = 0;
  let firstBlankLine = 0;

  function readBlock(block: string, firstLine: number): number {
    const lineCount = countLineBreaks(block);
    if (block.indexOf('"') === -1 && readBlockFast(block, lineCount)) {
      previousRowLine = firstLine + lineCount - 1;
      return lineCount;
    }
    let pos = 0;
    let lineNumber = firstLine;
    while (pos < block.length && !isRefused()) {
      const end = block.indexOf("\n", pos);
      const line = stripCarriageReturn(block.slice(pos, end));
      pos = end + 1;
      readDataLine(line, lineNumber++, false);
    }
    return lineCount;
  }

  /** udsv splits the block; if its rows do not account for every line, nothing of them is kept. */
  function readBlockFast(block: string, lineCount: number): boolean {
    const start = store.length;
    if (splitFast(block, lineCount, (row) => store.append(row) === "none")) {
      if (start === 0 && lineCount > 0) firstTime = firstTimeCell(block);
      return true;
    }
    store.truncate(start);
    return false;
  }

  function firstTimeCell(block: string): string {
    const end = block.indexOf("\n");
    const cells = splitLine(stripCarriageReturn(block.slice(0, end)), delimiter);
    return (cells?.[indexes.time] ?? "").trim();
  }

  function readDataLine(line: string, lineNumber: number, isUnterminatedLast: boolean): boolean {
    if (line.trim() === "") {
      if (blankLines++ === 0) firstBlankLine = lineNumber;
      return true;
    }
    const split = splitLine(line, delimiter);
    const shapeError = describeLineShape({ cells: split, lineNumber, header, mapping, isUnterminatedLast });
    if (shapeError) {
      refuse(shapeError);
      return false;
    }
    // describeLineShape refuses a line that could not be split.
    const cells = split as string[];
    const problem = store.append(cells);
    if (problem !== "none") {
      const previousTime = store.lastTime;
      refuse(describeRowProblem({ problem, badRole: store.badRole, previousRowLine, previousTime, maxRows, cells, lineNumber, header, indexes, mapping }));
      return false;
    }
    if (store.length === 1) firstTime = (cells[indexes.time] as string).trim();
    previousRowLine = lineNumber;
    return true;
  }

  function blankLinesWarning(): LogImportWarning | null {
    if (blankLines === 0) return null;
    const where = blankLines === 1 ? `Line ${firstBlankLine} is blank and was` : `${blankLines} blank lines (the first on line ${firstBlankLine}) were`;
    return { code: "blank-lines-skipped", line: firstBlankLine, message: `${where} skipped.` };
  }

  return {
    readBlock,
    readLastLine: (line, lineNumber) => readDataLine(line, lineNumber, true),
    get firstTime() {
      return firstTime;
    },
    blankLinesWarning,
  };
}

export function stripCarriageReturn(line: string): string {
  return line.charCodeAt(line.length - 1) === 13 ? line.slice(0, -1) : line;
}

export function countLineBreaks(text: string): number {
  let count = 0;
  for (let at = text.indexOf("\n"); at !== -1; at = text.indexOf("\n", at + 1)) count++;
  return count;
}
