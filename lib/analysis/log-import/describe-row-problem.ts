import type { ColumnMapping, MappedRole } from "./column-mapping";
import type { RoleIndexes, RowProblem } from "./log-column-store";
import { describeDelimiter, formatLinePlace, type LogImportError, type LogImportErrorCode } from "./log-import-error";
import { explainBadNumber, explainBadTimestamp, quoteCell, readTimestamp } from "./read-cell";

interface RowPlace {
  cells: readonly string[];
  lineNumber: number;
  header: readonly string[];
  indexes: RoleIndexes;
  mapping: ColumnMapping;
}

function placeError(code: LogImportErrorCode, line: number, text: string, column?: string): LogImportError {
  return { code, message: `${formatLinePlace(line, column)}: ${text}`, line, ...(column === undefined ? {} : { column }) };
}

/** The message for a row the column store refused. */
export function describeRowProblem({
  problem,
  badRole,
  previousRowLine,
  previousTime,
  maxRows,
  cells,
  lineNumber,
  header,
  indexes,
  mapping,
}: RowPlace & {
  problem: Exclude<RowProblem, "none">;
  badRole: MappedRole;
  previousRowLine: number;
  /** The previous row's time as stored: timestamps in milliseconds. */
  previousTime: number;
  maxRows: number;
}): LogImportError {
  const timeColumn = header[indexes.time] as string;
  const timeCell = quoteCell((cells[indexes.time] as string).trim());
  switch (problem) {
    case "too-many-rows":
      return placeError("too-many-rows", lineNumber, `the log has more than ${maxRows} data rows, the limit for one upload.`);
    case "time-backwards": {
      const stepBackMs = previousTime - readTimestamp(cells[indexes.time] as string);
      // Wall-clock time without a zone offset steps back an hour when daylight saving ends.
      const clockChange =
        mapping.time.form === "timestamp" && Math.abs(stepBackMs - 3_600_000) <= 120_000
          ? " The step back is about an hour: the timestamps may lack a zone offset across a clock change; export elapsed time instead."
          : "";
      return placeError(
        "time-backwards",
        lineNumber,
        `time goes backwards: ${timeCell} is earlier than the time on line ${previousRowLine}. Rows must be in time order.${clockChange}`,
        timeColumn,
      );
    }
    case "duplicate-time":
      return placeError(
        "duplicate-time",
        lineNumber,
        `${timeCell} repeats the time on line ${previousRowLine} (duplicate timestamp). Each row needs a later time than the one before; if the cycler logs faster than this column's resolution, export the time with more decimals.`,
        timeColumn,
      );
    case "bad-cell": {
      const column = header[indexes[badRole]] as string;
      const cell = cells[indexes[badRole]] as string;
      if (badRole === "time" && mapping.time.form === "timestamp") return placeError("non-numeric", lineNumber, `${explainBadTimestamp(cell)}.`, column);
      const { code, reason } = explainBadNumber(cell, mapping.decimalSeparator);
      return placeError(code, lineNumber, `${reason}.`, column);
    }
    default: {
      const unknown: never = problem;
      return placeError("non-numeric", lineNumber, String(unknown));
    }
  }
}

/** The message for a line whose cells do not match the header, or null when they do. */
export function describeLineShape({
  cells,
  lineNumber,
  header,
  mapping,
  isUnterminatedLast,
}: Omit<RowPlace, "indexes" | "cells"> & { cells: readonly string[] | null; isUnterminatedLast: boolean }): LogImportError | null {
  if (!cells) return placeError("unclosed-quote", lineNumber, 'a quote (") opened on this line is never closed.');
  const expected = header.length;
  if (cells.length === expected) return null;
  if (isUnterminatedLast && cells.length < expected) {
    return placeError(
      "truncated-last-line",
      lineNumber,
      `the last line has ${cells.length} of the header's ${expected} cells and no line ending: the file looks cut off. Upload the complete file.`,
    );
  }
  const hint =
    mapping.delimiter === "," && cells.length > expected
      ? " If the file writes decimal commas, they split its numbers into extra cells: such a file needs semicolons or tabs between cells."
      : cells.length === 1
        ? ` Is the delimiter ${describeDelimiter(mapping.delimiter)} right?`
        : "";
  return placeError("cell-count", lineNumber, `the line has ${cells.length} cells, but the header (line ${mapping.headerLine}) has ${expected}.${hint}`);
}
