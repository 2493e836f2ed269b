import { dictionary } from "@zxcvbn-ts/language-common";
import { z } from "zod";

/**
 * Password rules after OWASP ASVS 4.0 V2.1: at least 12 characters, any characters (spaces too, so a
 * passphrase of ordinary words is welcome), no composition rules; refused when it is one of the
 * passwords most often found in breaches (the list shipped with @zxcvbn-ts/language-common, about
 * 49 000 entries), made of one or two characters repeated, or contains the account's e-mail address.
 */
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 256;

let common: Set<string> | undefined;
function isCommonPassword(password: string): boolean {
  common ??= new Set(dictionary["passwords-common"].map((p) => p.toLowerCase()));
  const lower = password.toLowerCase();
  return common.has(lower) || common.has(lower.replace(/\s+/g, ""));
}

/** The reason a password is refused, in words, or null when it is acceptable. */
export function checkPassword(password: string, context: { email?: string } = {}): string | null {
  const length = [...password].length;
  if (length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters; a few ordinary words make a good passphrase.`;
  if (length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters.`;
  if (new Set(password.replace(/\s/g, "")).size < 3) return "Use more than one or two different characters; a few ordinary words make a good passphrase.";
  if (isCommonPassword(password)) return "This password is on a list of passwords found in breaches and tried first by attackers. Choose another.";
  const email = context.email?.trim().toLowerCase();
  if (email) {
    const lower = password.toLowerCase();
    const local = email.split("@")[0] ?? "";
    if (lower.includes(email) || (local.length >= 4 && lower.includes(local))) return "Do not use your e-mail address (or its name part) in the password.";
  }
  return null;
}

/** A new password on its own; the e-mail rule is added where the account is known (withPasswordRules). */
export const newPasswordSchema = z.string().superRefine((password, ctx) => {
  const problem = checkPassword(password);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});

/** Adds the e-mail rule to a schema holding the account's e-mail and a new password. */
export function refusePasswordWithEmail(value: { email: string; password: string }, ctx: z.RefinementCtx, path = "password"): void {
  const problem = checkPassword(value.password, { email: value.email });
  if (problem && !checkPassword(value.password)) ctx.addIssue({ code: "custom", path: [path], message: problem });
}
