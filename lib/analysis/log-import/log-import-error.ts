/** Why a log could not be read; callers branch on `code`, people read `message`. */
export type LogImportErrorCode =
  | "invalid-mapping"
  | "wrong-file-type"
  | "empty-file"
  | "header-not-found"
  | "wrong-delimiter"
  | "missing-column"
  | "ambiguous-column"
  | "no-data-rows"
  | "cell-count"
  | "unclosed-quote"
  | "line-too-long"
  | "non-numeric"
  | "decimal-separator-mismatch"
  | "time-backwards"
  | "duplicate-time"
  | "truncated-last-line"
  | "too-large"
  | "too-many-rows";

export interface LogImportError {
  code: LogImportErrorCode;
  message: string;
  /** Line in the file, counted from 1 as a person counts lines (blank lines included). */
  line?: number;
  /** The column's header text. */
  column?: string;
}

export type LogImportWarningCode = "blank-lines-skipped" | "lines-before-data-skipped" | "undecodable-characters";

/** Something worth telling the operator that does not stop the import. */
export interface LogImportWarning {
  code: LogImportWarningCode;
  message: string;
  line?: number;
}

export function formatLinePlace(line: number, column?: string): string {
  return column === undefined ? `Line ${line}` : `Line ${line}, column "${column}"`;
}

export function describeDelimiter(delimiter: string): string {
  return delimiter === "\t" ? "tabs" : delimiter === ";" ? 'semicolons (";")' : 'commas (",")';
}
