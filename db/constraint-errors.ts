import { DomainError } from "@/lib/errors";

/** PostgreSQL error codes we can explain to a person (see the PostgreSQL manual, appendix A). */
const UNIQUE_VIOLATION = "23505";
const FOREIGN_KEY_VIOLATION = "23503";
const CHECK_VIOLATION = "23514";
const RAISED_EXCEPTION = "P0001";
// Text and dates the database cannot hold; the proxy refuses most of them first (lib/security).
const UNTRANSLATABLE_CHARACTER = "22P05";
const CHARACTER_NOT_IN_REPERTOIRE = "22021";
const DATETIME_FIELD_OVERFLOW = "22008";
const INVALID_DATETIME_FORMAT = "22007";
const STATEMENT_TOO_COMPLEX = "54001";

const UNIQUE_MESSAGES: Record<string, string> = {
  app_user_email_key: "A user with this e-mail address already exists.",
  cell_specification_maker_model_key: "A specification for this maker and model already exists.",
  procedure_code_key: "A procedure with this code already exists.",
  procedure_version_one_open: "This procedure already has an open draft or review; continue with that one.",
  instrument_identifier_key: "An instrument with this identifier is already registered.",
  lot_identifier_key: "A lot with this identifier is already registered.",
  specimen_identifier_key: "A specimen with this identifier is already registered.",
  specimen_lot_position_key: "A specimen is already registered at this tray position of the lot; each position holds one cell.",
  lot_sample_draw_lot_id_key: "This lot's sample has already been drawn; a drawn sample is never drawn again.",
  electronic_signature_once: "This record already carries a signature with that meaning; it is signed once only.",
  certificate_replaces_id_key: "That certificate has already been replaced by an amendment; amend the newest one.",
  run_review_signature_id_key: "This signature already belongs to another review.",
  certificate_signature_id_key: "This signature already belongs to another certificate.",
};

const CHECK_MESSAGES: Record<string, string> = {
  procedure_version_second_engineer: "A second engineer must release this version: not its author, not whoever submitted it.",
  instrument_kind_known: "Choose a kind of instrument from the list.",
  instrument_due_after_calibration: "The calibration due date must be after the calibration date.",
  lot_quantity_received_positive: "The quantity received must be at least one cell.",
  lot_plan_complete: "A sampling plan needs its inspection level, AQL, severity and the plan itself, all together.",
  specimen_lot_position_check: "The tray position is a whole number from 1 up to the lot's quantity.",
  lot_sample_draw_seed: "A random draw records its seed; a draw of chosen positions has none.",
  run_review_return_says_why: "Say what the operator must fix: a returned run needs comments.",
  run_review_accept_is_signed: "Accepting a run needs the reviewer's signature and the evaluation reviewed.",
  certificate_amendment_says_why: "An amendment must say why it replaces the earlier certificate.",
  certificate_revocation_complete: "A revocation needs a reason, who revoked and when.",
};

// The database is down or restarting (class 08 and 57P01–57P03 of appendix A; connection refusals from
// Node; pg's message when a server closes a connection in use).
const UNAVAILABLE_CODES = new Set(["08000", "08001", "08003", "08004", "08006", "57P01", "57P02", "57P03", "ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE"]);
const UNAVAILABLE_MESSAGE = "The lab's database is not reachable just now (it may be restarting). Wait a minute and try again; nothing was changed.";

export function isDatabaseUnavailable(error: unknown): boolean {
  if (typeof error !== "object" || error === null) return false;
  const { code, message } = error as { code?: unknown; message?: unknown };
  if (typeof code === "string" && UNAVAILABLE_CODES.has(code)) return true;
  if (error instanceof AggregateError) return error.errors.some(isDatabaseUnavailable);
  return typeof message === "string" && /^Connection terminated( unexpectedly| due to connection timeout)?$/.test(message);
}

/** Turns a constraint error from pg into a DomainError with a plain message, or returns null. */
export function translateConstraintError(error: unknown): DomainError | null {
  if (isDatabaseUnavailable(error)) return new DomainError("unavailable", UNAVAILABLE_MESSAGE);
  if (typeof error !== "object" || error === null || !("code" in error)) return null;
  const { code, constraint, message } = error as { code?: string; constraint?: string; message?: string };
  switch (code) {
    case UNIQUE_VIOLATION:
      return new DomainError("conflict", UNIQUE_MESSAGES[constraint ?? ""] ?? "This record already exists.");
    case FOREIGN_KEY_VIOLATION:
      return new DomainError("conflict", "This record is still referenced by another record, or refers to one that does not exist.");
    case CHECK_VIOLATION:
      return new DomainError("invalid", CHECK_MESSAGES[constraint ?? ""] ?? `A value breaks a rule of the database (${constraint ?? "check"}).`);
    case UNTRANSLATABLE_CHARACTER:
    case CHARACTER_NOT_IN_REPERTOIRE:
      return new DomainError("invalid", "A text contains a character that cannot be stored (a NUL character or a broken one). Remove it and try again; nothing was saved.");
    case DATETIME_FIELD_OVERFLOW:
    case INVALID_DATETIME_FORMAT:
      return new DomainError("invalid", "A date or time is outside the calendar the lab's records use (for example the year 0000). Correct it and try again; nothing was saved.");
    case STATEMENT_TOO_COMPLEX:
      return new DomainError("invalid", "The text sent is nested too deeply to be stored. Nothing was saved.");
    case RAISED_EXCEPTION:
      return new DomainError("conflict", message ?? "The database refused this change.");
    default:
      return null;
  }
}
