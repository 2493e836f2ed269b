import { getDataStartLine, type ColumnMapping } from "./column-mapping";
import type { RoleIndexes } from "./log-column-store";
import { formatLinePlace, type LogImportError, type LogImportWarning } from "./log-import-error";
import { readHeaderLine } from "./read-header";

export interface HeaderLines {
  /** Reads one line before the data (metadata, the header, lines between it and the data); false once refused. */
  read(line: string, lineNumber: number): boolean;
  /** Whether any line so far held more than blanks. */
  readonly sawText: boolean;
  /** The header's cells and where each mapped column sits, once the header line has been read. */
  readonly found: { header: string[]; indexes: RoleIndexes } | null;
  /** True once the line before the first data line has been read with the header found. */
  readonly dataStarts: boolean;
}

/**
 * The lines of a log before its data: the header is read where the mapping expects it, lines between
 * the header and the data are skipped with a warning. A blank header line is only an error once the
 * file turns out to hold text at all, which the caller decides at the end.
 */
export function createHeaderLines({
  mapping,
  warnings,
  refuse,
}: {
  mapping: ColumnMapping;
  warnings: LogImportWarning[];
  refuse: (error: LogImportError) => void;
}): HeaderLines {
  const dataStartLine = getDataStartLine(mapping);
  let sawText = false;
  let found: { header: string[]; indexes: RoleIndexes } | null = null;
  let dataStarts = false;

  function read(line: string, lineNumber: number): boolean {
    const isBlank = line.trim() === "";
    if (!isBlank) sawText = true;
    if (lineNumber === mapping.headerLine && isBlank) return true;
    if (lineNumber > mapping.headerLine && !found && !isBlank) {
      const at = mapping.headerLine;
      refuse({ code: "header-not-found", message: `${formatLinePlace(at)}: the line where the mapping expects the header is blank.`, line: at });
      return false;
    }
    if (lineNumber === mapping.headerLine) {
      const reading = readHeaderLine({ line, lineNumber, mapping });
      if (!reading.ok) {
        refuse(reading.error);
        return false;
      }
      found = { header: reading.header, indexes: reading.indexes };
      warnings.push(...reading.warnings);
    }
    if (lineNumber > mapping.headerLine && lineNumber < dataStartLine) {
      warnings.push({ code: "lines-before-data-skipped", line: lineNumber, message: `Line ${lineNumber}, between the header and the data, was skipped.` });
    }
    if (lineNumber === dataStartLine - 1 && found) dataStarts = true;
    return true;
  }

  return {
    read,
    get sawText() {
      return sawText;
    },
    get found() {
      return found;
    },
    get dataStarts() {
      return dataStarts;
    },
  };
}
