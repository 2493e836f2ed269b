/**
 * Text the database cannot store, or that would only crash the code reading it: a NUL character
 * (PostgreSQL text and jsonb refuse U+0000), a lone UTF-16 surrogate (not a character at all), the
 * year 0000 (no such year in the calendar the database uses), and structures nested deeper than any
 * form of ours makes. Pure: the proxy runs it over every request, before any page, handler or action.
 */
export type UnstorableProblem = "nul" | "surrogate" | "year-zero" | "too-deep";

export interface UnstorableText {
  /** Where it was found: a form field name or a JSON path ("steps.3.label"); empty for the body itself. */
  path: string;
  problem: UnstorableProblem;
}

/** Deeper than any rich text or step list a person makes; a document 1 000 levels deep is an attack. */
export const MAX_NESTING = 128;

// A high surrogate not followed by a low one, or a low one not preceded by a high one.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const YEAR_ZERO = /^[+-]?0000-\d\d(-\d\d)?(?:[T ].*)?$/;

export function findInString(text: string): UnstorableProblem | null {
  if (text.includes("\u0000")) return "nul";
  if (LONE_SURROGATE.test(text)) return "surrogate";
  if (YEAR_ZERO.test(text.trim())) return "year-zero";
  return null;
}

/** The first unstorable piece of text in a parsed value, walking objects and arrays (keys too). */
export function findUnstorableText(value: unknown, path: string[] = [], depth = 0): UnstorableText | null {
  if (depth > MAX_NESTING) return { path: path.join("."), problem: "too-deep" };
  if (typeof value === "string") {
    const problem = findInString(value);
    if (problem) return { path: path.join("."), problem };
    // Forms carry rich text and step lists as JSON inside one field: look inside it too.
    const t = value.trimStart();
    if ((t.startsWith("{") || t.startsWith("[")) && value.length <= 12 * 1024 * 1024) {
      const nested = parseJsonSafely(value);
      if (nested === TOO_DEEP) return { path: path.join("."), problem: "too-deep" };
      if (nested !== undefined && typeof nested === "object") {
        // Named by the form field a person filled in, not by the path inside its JSON.
        const inner = findUnstorableText(nested, [], depth + 1);
        if (inner) return { path: path.join("."), problem: inner.problem };
      }
    }
    return null;
  }
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = findUnstorableText(value[i], [...path, String(i)], depth + 1);
      if (found) return found;
    }
    return null;
  }
  if (value !== null && typeof value === "object") {
    for (const [key, inner] of Object.entries(value)) {
      const keyProblem = findInString(key);
      if (keyProblem && keyProblem !== "year-zero") return { path: [...path, key].join("."), problem: keyProblem };
      const found = findUnstorableText(inner, [...path, key], depth + 1);
      if (found) return found;
    }
  }
  return null;
}

/**
 * JSON.parse recurses natively and can exhaust the stack on a hostile document; nesting is measured on
 * the text first so that never happens.
 */
export function parseJsonSafely(text: string): unknown {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92) i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 123 || c === 91) {
      if (++depth > MAX_NESTING + 1) return TOO_DEEP;
    } else if (c === 125 || c === 93) depth--;
  }
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

/** What parseJsonSafely answers for a document nested beyond MAX_NESTING. */
export const TOO_DEEP = Symbol("nested too deep");

/** "1_displayName" (a server action's form field) or "data.ratedCapacityMah" → "display name", "rated capacity mah". */
export function fieldInWords(path: string): string {
  const parts = path.split(".").filter((p) => p !== "" && !/^\d+$/.test(p));
  const last = (parts.at(-1) ?? "").replace(/^\d+_/, "").replace(/^\$ACTION_\w*$/, "");
  const words = last
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replace(/[_\-\s]+/g, " ")
    .trim()
    .toLowerCase();
  return words || "the text";
}

const PROBLEM_WORDS: Record<UnstorableProblem, string> = {
  nul: "contains a NUL character (U+0000), which cannot be stored",
  surrogate: "contains a broken character (half of a UTF-16 pair), which cannot be stored",
  "year-zero": "has the year 0000, which does not exist; enter a date from year 1 onwards",
  "too-deep": `is nested more than ${MAX_NESTING} levels deep; no document of this lab needs that many`,
};

export function describeUnstorableText(found: UnstorableText, opts: { saving: boolean } = { saving: true }): string {
  const field = fieldInWords(found.path);
  const subject = field === "the text" ? "The text sent" : `The field “${field}”`;
  return `${subject} ${PROBLEM_WORDS[found.problem]}. ${opts.saving ? "Nothing was saved." : "Remove it and try again."}`;
}

/** Set only by the proxy (which removes any copy a client sent): a server action refuses with its message. */
export const UNSTORABLE_HEADER = "x-cellwright-unstorable";

/** The proxy's finding as a server action reads it from the header, or null. */
export function readUnstorableHeader(value: string | null): { field: string; message: string } | null {
  if (!value) return null;
  try {
    const parsed = JSON.parse(decodeURIComponent(value)) as { field?: unknown; message?: unknown };
    return typeof parsed.message === "string" ? { field: typeof parsed.field === "string" ? parsed.field : "", message: parsed.message } : null;
  } catch {
    return null;
  }
}
