import { createHash } from "node:crypto";

/**
 * The canonical JSON text of a value: object keys sorted by UTF-16 code units, no whitespace,
 * numbers and strings as JSON.stringify writes them, `undefined` properties left out. Two payloads
 * with the same content give the same text whatever order their keys were built in, and whatever
 * PostgreSQL's jsonb did to the order on the way back. Anything that is not plain JSON (NaN,
 * Infinity, a Date, a function, a bigint, a cycle) is refused: a certificate states plain values.
 */
export function toCanonicalJson(value: unknown): string {
  return write(value, "$", new Set());
}

function write(value: unknown, path: string, seen: Set<object>): string {
  if (value === null) return "null";
  switch (typeof value) {
    case "string":
    case "boolean":
      return JSON.stringify(value);
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`${path} is ${value}: canonical JSON holds finite numbers only`);
      return JSON.stringify(value);
    case "object":
      break;
    default:
      throw new TypeError(`${path} is a ${typeof value}: canonical JSON holds plain JSON values only`);
  }
  if (seen.has(value)) throw new TypeError(`${path} refers back to itself`);
  seen.add(value);
  try {
    if (Array.isArray(value)) return `[${value.map((item, i) => (item === undefined ? "null" : write(item, `${path}[${i}]`, seen))).join(",")}]`;
    const prototype = Object.getPrototypeOf(value);
    if (prototype !== Object.prototype && prototype !== null) {
      throw new TypeError(`${path} is a ${value.constructor?.name ?? "non-plain object"}: write dates and buffers as strings first`);
    }
    const entries = Object.keys(value)
      .filter((key) => (value as Record<string, unknown>)[key] !== undefined)
      .sort()
      .map((key) => `${JSON.stringify(key)}:${write((value as Record<string, unknown>)[key], `${path}.${key}`, seen)}`);
    return `{${entries.join(",")}}`;
  } finally {
    seen.delete(value);
  }
}

/** SHA-256 (hex) of the canonical JSON text, encoded as UTF-8. */
export function hashCanonicalJson(value: unknown): string {
  return createHash("sha256").update(toCanonicalJson(value), "utf8").digest("hex");
}
