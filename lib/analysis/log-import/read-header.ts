import { listMappedColumns, type ColumnMapping, type MappedRole } from "./column-mapping";
import type { RoleIndexes } from "./log-column-store";
import { describeDelimiter, formatLinePlace, type LogImportError, type LogImportErrorCode, type LogImportWarning } from "./log-import-error";
import { normaliseHeaderCell, splitLine } from "./split-line";

export type HeaderReading =
  | { ok: true; header: string[]; indexes: RoleIndexes; warnings: LogImportWarning[] }
  | { ok: false; error: LogImportError };

const roleWords: Record<MappedRole, string> = {
  time: "time",
  voltage: "voltage",
  current: "current",
  temperature: "temperature",
  step: "the step index",
  capacity: "capacity",
};

/** Splits the header line and finds each mapped column in it, by its header text. */
export function readHeaderLine({ line, lineNumber, mapping }: { line: string; lineNumber: number; mapping: ColumnMapping }): HeaderReading {
  const refuse = (code: LogImportErrorCode, text: string, column?: string): HeaderReading => ({
    ok: false,
    error: { code, message: `${formatLinePlace(lineNumber, column)}: ${text}`, line: lineNumber, ...(column === undefined ? {} : { column }) },
  });
  const { delimiter } = mapping;
  const cells = splitLine(line, delimiter);
  if (!cells) return refuse("unclosed-quote", 'a quote (") opened in the header is never closed.');
  const header = cells.map(normaliseHeaderCell);
  if (header.length === 1) {
    const other = [",", ";", "\t"].find((d) => d !== delimiter && line.includes(d));
    const hint = other ? ` The file seems to use ${describeDelimiter(other)}: choose it in the mapping.` : " A log needs at least time, voltage and current columns.";
    return refuse("wrong-delimiter", `the header has a single column when split at ${describeDelimiter(delimiter)}.${hint}`);
  }
  const warnings: LogImportWarning[] = [];
  if (header.some((name) => name.includes("\uFFFD"))) {
    warnings.push({
      code: "undecodable-characters",
      line: lineNumber,
      message: `Line ${lineNumber}: the header has characters that are not UTF-8 (shown as \uFFFD); the file may have been saved in another encoding.`,
    });
  }
  const indexes: RoleIndexes = { time: -1, voltage: -1, current: -1, temperature: -1, step: -1, capacity: -1 };
  for (const [role, name] of listMappedColumns(mapping)) {
    const at = header.indexOf(name);
    if (at === -1) {
      const listed = header.map((h) => `"${h}"`).join(", ");
      return refuse("missing-column", `the header has no column for ${roleWords[role]}. Its columns are ${listed}.`, name);
    }
    if (header.indexOf(name, at + 1) !== -1) {
      return refuse("ambiguous-column", `the header names this column more than once, so it is not clear which holds ${roleWords[role]}.`, name);
    }
    indexes[role] = at;
  }
  return { ok: true, header, indexes, warnings };
}
