/**
 * A failure the domain expects and can explain: it carries a stable code, an HTTP status and a
 * message a lab technician can act on. Anything else is a bug and is reported generically.
 */
export type DomainErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not-found"
  | "conflict"
  | "invalid"
  | "rate-limited"
  | "foreign-origin"
  | "integrity"
  | "too-large"
  | "unavailable";

const STATUS: Record<DomainErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  "not-found": 404,
  conflict: 409,
  invalid: 422,
  "rate-limited": 429,
  "foreign-origin": 403,
  // A stored file that no longer matches its recorded hash, or is missing: refused, never served.
  integrity: 409,
  "too-large": 413,
  unavailable: 503,
};

export class DomainError extends Error {
  readonly code: DomainErrorCode;
  readonly status: number;
  /** The form field or JSON path the error is about, when there is one. */
  readonly field?: string;
  constructor(code: DomainErrorCode, message: string, options: { field?: string } = {}) {
    super(message);
    this.name = "DomainError";
    this.code = code;
    this.status = STATUS[code];
    if (options.field) this.field = options.field;
  }
}

export function isDomainError(error: unknown): error is DomainError {
  return error instanceof DomainError;
}
