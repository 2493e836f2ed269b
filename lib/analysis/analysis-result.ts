/** Why a computation could not give a result; callers branch on `code`, people read `message`. */
export type AnalysisErrorCode =
  | "invalid-input"
  | "invalid-range"
  | "time-not-increasing"
  | "non-finite-value"
  | "no-pulse-found"
  | "too-many-samples";

export interface AnalysisError {
  code: AnalysisErrorCode;
  message: string;
}

/** A typed result: bad input comes back as data, never as a thrown error. */
export type AnalysisResult<T> = { ok: true; value: T } | { ok: false; error: AnalysisError };

export function succeed<T>(value: T): AnalysisResult<T> {
  return { ok: true, value };
}

export function fail<T = never>(code: AnalysisErrorCode, message: string): AnalysisResult<T> {
  return { ok: false, error: { code, message } };
}
