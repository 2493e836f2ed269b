import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readNumber, readTimestamp } from "@/lib/analysis/log-import";

/** Decimal text as a cycler prints it: sign, integer digits, optional fraction. */
const decimalText = fc
  .record({
    negative: fc.boolean(),
    whole: fc.stringMatching(/^(0|[1-9]\d{0,9})$/),
    fraction: fc.stringMatching(/^\d{0,12}$/),
  })
  .map(({ negative, whole, fraction }) => `${negative ? "-" : ""}${whole}${fraction === "" ? "" : `.${fraction}`}`);

describe("readNumber", () => {
  it("gives exactly what Number() gives for printed decimals, with point or comma", () => {
    fc.assert(
      fc.property(decimalText, (text) => {
        expect(Object.is(readNumber(text, false), Number(text))).toBe(true);
        expect(Object.is(readNumber(text.replace(".", ","), true), Number(text))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("gives exactly what Number() gives for any double's shortest text, exponents included", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        expect(Object.is(readNumber(String(x), false), Number(String(x)))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("moves the decimal point three places for milli-units, to the double nearest the value", () => {
    fc.assert(
      fc.property(decimalText, (text) => {
        expect(Object.is(readNumber(text, false, 3), Number(`${text}e-3`))).toBe(true);
      }),
      { numRuns: 2000 },
    );
    expect(readNumber("3517.9", false, 3)).toBe(3.5179);
    expect(readNumber("4,2", true, 3)).toBe(0.0042);
  });

  it("allows spaces and a trailing carriage return", () => {
    expect(readNumber(" 3.7 ", false)).toBe(3.7);
    expect(readNumber("3.7\r", false)).toBe(3.7);
    expect(readNumber("+1e-3", false)).toBe(0.001);
  });

  it("refuses blanks, words, infinities and number literals that are not decimals", () => {
    for (const text of ["", " ", "\r", "abc", "1.2.3", "0x10", "0b1", "1e", "Infinity", "-Infinity", "NaN", "--1", "1-", "+", "-", ".", "3,7"]) {
      expect(readNumber(text, false), text).toBeNaN();
    }
  });

  it("refuses a point in a decimal-comma file (it may be a thousands separator)", () => {
    expect(readNumber("1.234,5", true)).toBeNaN();
    expect(readNumber("3.7", true)).toBeNaN();
    expect(readNumber("3,7", true)).toBe(3.7);
  });
});

describe("readTimestamp", () => {
  it("reads ISO 8601 and date-space-time forms, with fractions and offsets", () => {
    const base = Date.UTC(2026, 2, 1, 8, 0, 0);
    expect(readTimestamp("2026-03-01T08:00:00Z")).toBe(base);
    expect(readTimestamp("2026-03-01 08:00:00")).toBe(base);
    expect(readTimestamp("2026/03/01 08:00:00")).toBe(base);
    expect(readTimestamp(" 2026-03-01T08:00:00.250\r")).toBe(base + 250);
    expect(readTimestamp("2026-03-01T08:00:00,5")).toBe(base + 500);
    expect(readTimestamp("2026-03-01T10:00:00+02:00")).toBe(base);
    expect(readTimestamp("2026-03-01T10:00:00+0200")).toBe(base);
    expect(readTimestamp("2026-03-01T02:30:00-05:30")).toBe(base);
    expect(readTimestamp("2024-02-29 00:00:00")).toBe(Date.UTC(2024, 1, 29));
  });

  it("reads back any instant written by toISOString", () => {
    fc.assert(
      fc.property(fc.integer({ min: Date.UTC(1990, 0, 1), max: Date.UTC(2100, 0, 1) }), (ms) => {
        expect(readTimestamp(new Date(ms).toISOString())).toBe(ms);
      }),
      { numRuns: 1000 },
    );
  });

  it("refuses impossible dates and other forms", () => {
    for (const text of [
      "",
      "2026-03-01",
      "2026-02-30 00:00:00",
      "2100-02-29 00:00:00",
      "2026-13-01 00:00:00",
      "2026-03-01T24:00:00",
      "2026-03-01T08:60:00",
      "2026-03-01T08:00:00.",
      "2026-03-01T08:00:00 extra",
      "2026-03-01T08:00:00+25:00",
      "01.03.2026 08:00:00",
      "2026-03/01 08:00:00",
      "12.5",
    ]) {
      expect(readTimestamp(text), text).toBeNaN();
    }
  });
});
