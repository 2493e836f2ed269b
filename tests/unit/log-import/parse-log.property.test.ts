import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createLogParser, parseLog, parseLogAsync, type ColumnMapping, type LogImportErrorCode, type LogParseResult } from "@/lib/analysis/log-import";
import { defaultMapping, encode, formatCsv, makeLog, mapFormat, splitAt } from "./log-fixtures";

const errorCodes: readonly LogImportErrorCode[] = [
  "invalid-mapping",
  "wrong-file-type",
  "empty-file",
  "header-not-found",
  "wrong-delimiter",
  "missing-column",
  "ambiguous-column",
  "no-data-rows",
  "cell-count",
  "unclosed-quote",
  "line-too-long",
  "non-numeric",
  "decimal-separator-mismatch",
  "time-backwards",
  "duplicate-time",
  "truncated-last-line",
  "too-large",
  "too-many-rows",
];

function parseChunks(chunks: Uint8Array[], mapping: ColumnMapping = defaultMapping, maxBytes = 1 << 22): LogParseResult {
  return parseLog({ mapping, chunks, options: { maxBytes, maxLineChars: 4096 } });
}

/** What any result must satisfy, good or bad. */
function expectWellFormed(result: LogParseResult, lineCount: number): void {
  if (result.ok) {
    const { columns } = result;
    expect(columns.length).toBe(result.rows);
    for (const column of [columns.timeS, columns.voltageV, columns.currentA, columns.temperatureC, columns.cyclerStep]) {
      if (column) expect(column.length).toBe(result.rows);
      if (column) expect(column.every(Number.isFinite)).toBe(true);
    }
    expect(columns.timeS[0]).toBe(0);
    for (let k = 1; k < columns.length; k++) expect(columns.timeS[k] as number).toBeGreaterThan(columns.timeS[k - 1] as number);
  } else {
    expect(errorCodes).toContain(result.error.code);
    expect(result.error.message.length).toBeGreaterThan(10);
    if (result.error.line !== undefined) {
      expect(result.error.line).toBeGreaterThanOrEqual(1);
      expect(result.error.line).toBeLessThanOrEqual(lineCount + 1);
      expect(result.error.message).toContain(`ine ${result.error.line}`);
    }
    if (result.error.column !== undefined) expect(result.error.message).toContain(`column "${result.error.column}"`);
  }
}

// Multi-byte characters (°, the byte order mark), CRLF, metadata lines and decimal commas.
const awkward = (() => {
  const format = { delimiter: ";", decimalSeparator: ",", lineEnding: "\r\n", currentUnit: "mA", dischargeCurrent: "positive" } as const;
  const text = "\uFEFFCycler: an invented one\r\nCell: model X-1 (3 000 mAh, 23 °C)\r\n" + formatCsv(makeLog({ sampleIntervalS: 60 }), format);
  return { bytes: encode(text), mapping: mapFormat(format, { headerLine: 3 }) };
})();

describe("parseLog over chunk boundaries", () => {
  const whole = parseChunks([awkward.bytes], awkward.mapping);

  it("reads the awkward file whole", () => {
    expect(whole.ok && whole.rows).toBeGreaterThan(200);
  });

  it("gives the identical result wherever the bytes are split", () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: awkward.bytes.length }), { maxLength: 40 }), (cuts) => {
        expect(parseChunks(splitAt(awkward.bytes, cuts), awkward.mapping)).toEqual(whole);
      }),
      { numRuns: 100 },
    );
  });

  it("gives the identical result byte by byte", () => {
    const small = awkward.bytes.subarray(0, awkward.bytes.indexOf(10, 3000) + 1);
    const bytes = Array.from(small, (b) => Uint8Array.of(b));
    expect(parseChunks(bytes, awkward.mapping)).toEqual(parseChunks([small], awkward.mapping));
  });

  it("does not depend on the caller keeping its chunks: a reused read buffer gives the same log", () => {
    const bytes = encode(`\uFEFF${formatCsv(makeLog({ sampleIntervalS: 120 }))}`);
    // Five-byte reads: the first ones are held back until the file type is known.
    const buffer = new Uint8Array(5);
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 22 });
    for (let at = 0; at < bytes.length; at += buffer.length) {
      const piece = bytes.subarray(at, at + buffer.length);
      buffer.set(piece);
      parser.push(buffer.subarray(0, piece.length));
      buffer.fill(0x39);
    }
    expect(parser.finish()).toEqual(parseChunks([bytes]));
  });

  it("gives the identical refusal wherever the bytes of a bad file are split", () => {
    const text = new TextDecoder().decode(awkward.bytes);
    const lines = text.split("\r\n");
    lines[150] = (lines[150] as string).replace(/;[^;]*$/, ";x");
    const bad = encode(lines.join("\r\n"));
    const refused = parseChunks([bad], awkward.mapping);
    expect(refused).toMatchObject({ ok: false, error: { code: "non-numeric", line: 151, column: "Temperature (°C)" } });
    fc.assert(
      fc.property(fc.array(fc.nat({ max: bad.length }), { maxLength: 40 }), (cuts) => {
        expect(parseChunks(splitAt(bad, cuts), awkward.mapping)).toEqual(refused);
      }),
      { numRuns: 100 },
    );
  });

  it("reads an asynchronous stream of chunks, and stops reading it at a refusal", async () => {
    async function* stream(bytes: Uint8Array, read: { count: number }) {
      for (let at = 0; at < bytes.length; at += 1000) {
        read.count++;
        yield bytes.subarray(at, at + 1000);
      }
    }
    const read = { count: 0 };
    expect(await parseLogAsync({ mapping: awkward.mapping, chunks: stream(awkward.bytes, read), options: { maxBytes: 1 << 22 } })).toEqual(whole);
    const refused = { count: 0 };
    const result = await parseLogAsync({ mapping: awkward.mapping, chunks: stream(awkward.bytes, refused), options: { maxBytes: 2500 } });
    expect(result).toMatchObject({ ok: false, error: { code: "too-large" } });
    expect(refused.count).toBe(3);
    expect(read.count).toBe(Math.ceil(awkward.bytes.length / 1000));
  });

  it("reports progress in bytes and rows after each chunk", () => {
    const seen: { bytes: number; rows: number }[] = [];
    const parser = createLogParser(awkward.mapping, { maxBytes: 1 << 22, onProgress: (p) => seen.push(p) });
    for (const chunk of splitAt(awkward.bytes, [4000, 8000, 12_000])) parser.push(chunk);
    const result = parser.finish();
    expect(seen.map((p) => p.bytes)).toEqual([4000, 8000, 12_000, awkward.bytes.length]);
    expect(seen.map((p) => p.rows).every((rows, k, all) => k === 0 || rows >= (all[k - 1] as number))).toBe(true);
    expect(seen.at(-1)?.rows).toBeGreaterThan(0);
    expect(result.ok && result.rows).toBeGreaterThanOrEqual(seen.at(-1)?.rows as number);
  });
});

describe("parseLog on arbitrary input", () => {
  it("never throws on arbitrary bytes, however they are chunked", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 3000 }), fc.array(fc.nat({ max: 3000 }), { maxLength: 8 }), (bytes, cuts) => {
        const result = parseChunks(splitAt(bytes, cuts));
        expectWellFormed(result, bytes.filter((b) => b === 10).length + 1);
      }),
      { numRuns: 500 },
    );
  });

  // Rows of mostly good cells with some damage reach far deeper into the parser than random bytes.
  const junk = fc.array(fc.constantFrom(..."0123456789.,;-e\t\r\n\"  :TZ+x°".split("")), { maxLength: 6 }).map((cs) => cs.join(""));
  const goodCell = fc.double({ min: -5000, max: 5000, noNaN: true }).map((x) => x.toFixed(3));
  const logLike = fc
    .tuple(
      fc.constantFrom("", "Time (s),Step,Voltage (V),Current (A),Temperature (°C)\n", "Meta\nTime (s),Step,Voltage (V),Current (A),Temperature (°C)\r\n"),
      fc.array(
        fc.tuple(
          fc.array(fc.oneof({ arbitrary: goodCell, weight: 12 }, { arbitrary: junk, weight: 1 }), { minLength: 3, maxLength: 6 }),
          fc.constantFrom("\n", "\n", "\n", "\r\n", "\n\n", ""),
        ),
        { maxLength: 60 },
      ),
    )
    .map(([head, rows]) => head + rows.map(([cells, end], k) => [String(k * 1.5), ...cells].slice(0, 1 + (cells.length > 4 ? 4 : cells.length)).join(",") + end).join(""));

  it("never throws on damaged logs, and what it accepts is a valid log", () => {
    let accepted = 0;
    fc.assert(
      fc.property(logLike, fc.array(fc.nat({ max: 3000 }), { maxLength: 8 }), fc.constantFrom(1, 2), (text, cuts, headerLine) => {
        const bytes = encode(text);
        const result = parseChunks(splitAt(bytes, cuts), { ...defaultMapping, headerLine }, 2500);
        if (result.ok) accepted++;
        expectWellFormed(result, text.split("\n").length);
      }),
      // Seeded: the count below checks the generator's reach, which must not depend on the draw.
      { numRuns: 500, seed: 61960 },
    );
    // The damage is light enough that some logs get through whole.
    expect(accepted).toBeGreaterThan(10);
  });

  it("reads random numeric rows, quoted or not, with blank lines, exactly as Number() reads each cell", () => {
    const cell = fc.tuple(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.integer({ min: 0, max: 8 })).map(([x, d]) => x.toFixed(d));
    const row = fc.tuple(cell, cell, cell, fc.boolean(), fc.boolean());
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 300 }), fc.array(fc.nat({ max: 20_000 }), { maxLength: 6 }), (rows, cuts) => {
        const lines = ["Time (s),Voltage (V),Current (A)"];
        rows.forEach(([v, i, , quoted, blankAfter], k) => {
          const cells = [String(k), v, i];
          lines.push(quoted ? cells.map((c) => `"${c}"`).join(",") : cells.join(","));
          if (blankAfter) lines.push("");
        });
        const mapping = mapFormat({ columns: ["time", "voltage", "current"] });
        const result = parseChunks(splitAt(encode(lines.join("\n") + "\n"), cuts), mapping);
        if (!result.ok) throw new Error(result.error.message);
        expect(Array.from(result.columns.voltageV)).toEqual(rows.map(([v]) => Number(v)));
        expect(Array.from(result.columns.currentA)).toEqual(rows.map(([, i]) => Number(i)));
      }),
      { numRuns: 200 },
    );
  });
});
