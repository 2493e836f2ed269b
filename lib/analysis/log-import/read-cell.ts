import type { DecimalSeparator } from "./column-mapping";
import type { LogImportErrorCode } from "./log-import-error";

/** 10^k is an exact double for k ≤ 22. */
const powersOf10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * Reads a number written with a decimal point (or, when `decimalComma`, a decimal comma), or NaN,
 * divided by 10^`shift` (3 turns mV into V). Blank cells and infinities are NaN; spaces and a
 * trailing CR around the number are allowed. For plain decimals the result is the double nearest
 * to the written value (the same as Number() when shift is 0), about twice as fast as Number().
 */
export function readNumber(cell: string, decimalComma: boolean, shift = 0): number {
  const mark = decimalComma ? 44 : 46;
  const length = cell.length;
  let k = 0;
  let negative = false;
  if (cell.charCodeAt(0) === 45) {
    negative = true;
    k = 1;
  }
  let mantissa = 0;
  let digits = 0;
  let fractionDigits = 0;
  let seenMark = false;
  for (; k < length; k++) {
    const code = cell.charCodeAt(k);
    const digit = code - 48;
    if (digit >= 0 && digit <= 9) {
      mantissa = mantissa * 10 + digit;
      digits++;
      if (seenMark) fractionDigits++;
    } else if (code === mark && !seenMark) {
      seenMark = true;
    } else if (code !== 13 || k !== length - 1) {
      return readNumberSlowly(cell, decimalComma, shift);
    }
  }
  if (digits === 0 || digits > 15) return readNumberSlowly(cell, decimalComma, shift);
  // Clinger's fast path: with at most 15 digits the mantissa and 10^k (k ≤ 22) are exact doubles, so
  // the one correctly rounded division gives the double nearest to the written decimal.
  const value = mantissa / (powersOf10[fractionDigits + shift] as number);
  return negative ? -value : value;
}

const decimalPattern = /^\s*([+-]?(?:\d+\.?\d*|\.\d+))(?:[eE]([+-]?\d+))?\s*$/;

/**
 * Exponents, a plus sign, spaces, long mantissas: read by Number() with the shift added to the
 * exponent, so the result is still the double nearest to the written value. Unlike Number(), blank
 * text and hexadecimal, octal or binary literals are refused.
 */
function readNumberSlowly(cell: string, decimalComma: boolean, shift: number): number {
  // A point in a decimal-comma file may be a thousands separator: refuse rather than guess.
  if (decimalComma && cell.indexOf(".") !== -1) return Number.NaN;
  const match = decimalPattern.exec(decimalComma ? cell.replace(",", ".") : cell);
  if (!match) return Number.NaN;
  const value = Number(`${match[1]}e${Number(match[2] ?? "0") - shift}`);
  return value - value === 0 ? value : Number.NaN;
}

const daysInMonth = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

/**
 * Reads `YYYY-MM-DD[T ]HH:MM:SS[.fff][Z|±HH[:]MM]` (ISO 8601; `/` also accepted between the date
 * parts) as milliseconds, or NaN. A timestamp without an offset is read as if it were UTC: only the
 * differences between samples are used, and they do not depend on the zone.
 */
export function readTimestamp(cell: string): number {
  let from = 0;
  let to = cell.length;
  while (from < to && cell.charCodeAt(from) <= 32) from++;
  while (to > from && cell.charCodeAt(to - 1) <= 32) to--;
  if (to - from < 19) return Number.NaN;
  const dateSeparator = cell.charCodeAt(from + 4);
  const between = cell.charCodeAt(from + 10);
  const punctuationOk =
    (dateSeparator === 45 || dateSeparator === 47) &&
    cell.charCodeAt(from + 7) === dateSeparator &&
    (between === 84 || between === 116 || between === 32) &&
    cell.charCodeAt(from + 13) === 58 &&
    cell.charCodeAt(from + 16) === 58;
  if (!punctuationOk) return Number.NaN;
  const year = readDigits(cell, from, 4);
  const month = readDigits(cell, from + 5, 2);
  const day = readDigits(cell, from + 8, 2);
  const hour = readDigits(cell, from + 11, 2);
  const minute = readDigits(cell, from + 14, 2);
  const second = readDigits(cell, from + 17, 2);
  if (year < 0 || month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59 || second < 0 || second > 59) {
    return Number.NaN;
  }
  const isLeap = year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
  if (day > (month === 2 && !isLeap ? 28 : (daysInMonth[month - 1] as number))) return Number.NaN;

  let pos = from + 19;
  let fractionMs = 0;
  const mark = cell.charCodeAt(pos);
  if (pos < to && (mark === 46 || mark === 44)) {
    let digits = 0;
    let scale = 1;
    pos++;
    while (pos < to && isDigit(cell.charCodeAt(pos))) {
      digits = digits * 10 + cell.charCodeAt(pos) - 48;
      scale *= 10;
      pos++;
    }
    if (scale === 1) return Number.NaN;
    fractionMs = (digits * 1000) / scale;
  }
  let offsetMinutes = 0;
  if (pos < to) {
    const c = cell.charCodeAt(pos);
    if (c === 90 || c === 122) {
      pos++;
    } else if (c === 43 || c === 45) {
      const hours = readDigits(cell, pos + 1, 2);
      pos += 3;
      if (cell.charCodeAt(pos) === 58) pos++;
      const minutes = readDigits(cell, pos, 2);
      pos += 2;
      if (hours < 0 || hours > 23 || minutes < 0 || minutes > 59) return Number.NaN;
      offsetMinutes = (c === 45 ? -1 : 1) * (hours * 60 + minutes);
    }
  }
  if (pos !== to) return Number.NaN;
  return Date.UTC(year, month - 1, day, hour, minute, second) + fractionMs - offsetMinutes * 60_000;
}

function isDigit(code: number): boolean {
  return code >= 48 && code <= 57;
}

/** The whole number written in `count` digits at `at`, or -1. */
function readDigits(text: string, at: number, count: number): number {
  let value = 0;
  for (let k = at; k < at + count; k++) {
    const code = text.charCodeAt(k);
    if (!isDigit(code)) return -1;
    value = value * 10 + code - 48;
  }
  return value;
}

const decimalCommaNumber = /^\s*[+-]?\d*,\d+\s*$/;
const decimalPointNumber = /^\s*[+-]?\d*\.\d+(?:[eE][+-]?\d+)?\s*$/;

/** Says why a cell is not a number, telling a decimal separator mix-up apart from other text. */
export function explainBadNumber(cell: string, decimalSeparator: DecimalSeparator): { code: LogImportErrorCode; reason: string } {
  const shown = quoteCell(cell);
  if (cell.trim() === "") return { code: "non-numeric", reason: "the cell is empty; a number is needed" };
  if (decimalSeparator === "." && decimalCommaNumber.test(cell)) {
    return { code: "decimal-separator-mismatch", reason: `${shown} has a decimal comma, but the mapping says decimal point. Choose decimal comma in the mapping` };
  }
  if (decimalSeparator === "," && decimalPointNumber.test(cell)) {
    return { code: "decimal-separator-mismatch", reason: `${shown} has a decimal point, but the mapping says decimal comma. Choose decimal point in the mapping` };
  }
  return { code: "non-numeric", reason: `${shown} is not a number` };
}

export function explainBadTimestamp(cell: string): string {
  if (cell.trim() === "") return "the cell is empty; a timestamp is needed";
  return `${quoteCell(cell)} is not a timestamp of the form 2024-03-01T08:00:00 or 2024-03-01 08:00:00`;
}

/** A cell shown in a message: quoted, invisible characters escaped, long text cut. */
export function quoteCell(cell: string): string {
  const cut = cell.length > 40 ? `${cell.slice(0, 40)}…` : cell;
  return JSON.stringify(cut);
}
