import { ZodError } from "zod";
import { isDomainError } from "@/lib/errors";
import { translateConstraintError } from "@/db/constraint-errors";

export interface ApiErrorBody {
  error: { code: string; message: string; fields?: { path: string; message: string }[] };
}

/**
 * The one place an error becomes an HTTP answer: zod → 422 with field paths, a domain error →
 * its own status, a known database constraint → its message, anything else → 500 with a generic
 * message while the real error goes to the server log.
 */
export function toErrorResponse(error: unknown, log: (e: unknown) => void = console.error): Response {
  if (error instanceof ZodError) {
    const fields = error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
    return json(422, { error: { code: "invalid", message: "Some fields are not valid.", fields } });
  }
  const domain = isDomainError(error) ? error : translateConstraintError(error);
  if (domain) {
    const fields = domain.field ? [{ path: domain.field, message: domain.message }] : undefined;
    return json(domain.status, { error: { code: domain.code, message: domain.message, ...(fields && { fields }) } });
  }
  log(error);
  return json(500, { error: { code: "internal", message: "Something went wrong on the server; it has been logged." } });
}

function json(status: number, body: ApiErrorBody): Response {
  return Response.json(body, { status });
}
