import { ZodError } from "zod";
import { isDomainError } from "@/lib/errors";
import { translateConstraintError } from "@/db/constraint-errors";
import { isZodDefaultMessage, plainZodMessage } from "./plain-zod-message";

/** What a server action answers to its form: a message, and errors per field where they apply. */
export interface ActionState {
  ok: boolean;
  message?: string;
  fieldErrors?: Record<string, string[]>;
}

export const initialActionState: ActionState = { ok: false };

/** The action-side twin of the API error handler: known failures become messages, the rest is logged. */
export function toActionState(error: unknown, log: (e: unknown) => void = console.error): ActionState {
  if (error instanceof ZodError) {
    const fieldErrors: Record<string, string[]> = {};
    for (const issue of error.issues) {
      const key = issue.path.map(String).join(".") || "form";
      // Schemas parsed deeper in the domain may still carry zod's own wording: say it plainly.
      (fieldErrors[key] ??= []).push(isZodDefaultMessage(issue.message) ? plainZodMessage(issue) : issue.message);
    }
    return { ok: false, message: "Some fields need attention.", fieldErrors };
  }
  const domain = isDomainError(error) ? error : translateConstraintError(error);
  if (domain) {
    // A server action's form fields arrive as "1_name": the form knows them as "name".
    const field = domain.field?.replace(/^\d+_/, "");
    return { ok: false, message: domain.message, ...(field && { fieldErrors: { [field]: [domain.message] } }) };
  }
  log(error);
  return { ok: false, message: "Something went wrong on the server; it has been logged. Try again." };
}
