import { z } from "zod";

/**
 * A lab's own identifier for an instrument, a lot or a specimen, as printed on its label: letters,
 * digits and . _ / -, so it survives file names, URLs and barcode printers.
 */
export function recordIdentifierSchema(what: string) {
  return z
    .string({ error: "required" })
    .trim()
    .min(1, { error: `Give the ${what}.` })
    .max(64, { error: `The ${what} has at most 64 characters.` })
    .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { error: `The ${what} uses letters, digits and . _ / - only, and starts with a letter or digit.` });
}

/** A free-text field that may be left empty: empty text becomes null. */
export function optionalTextSchema(max: number) {
  return z
    .string()
    .trim()
    .max(max, { error: `At most ${max} characters.` })
    .nullish()
    .transform((v) => (v ? v : null));
}
