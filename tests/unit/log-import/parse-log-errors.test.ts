import { describe, expect, it } from "vitest";
import { createLogParser, type ColumnMapping } from "@/lib/analysis/log-import";
import { defaultMapping, encode, expectError, expectParsed, formatCsv, header, makeLog, mapFormat, parseText } from "./log-fixtures";

const rows = ["0.000,1,3.6000,1.50000,23.00", "10.000,1,3.6500,1.50000,23.10", "20.000,1,3.7000,1.50000,23.20", "30.000,1,3.7500,1.50000,23.30"];
const good = [header, ...rows].join("\n") + "\n";

/** The good file with one line (counted from 1, header is line 1) replaced. */
function withLine(line: number, text: string): string {
  const lines = good.split("\n");
  lines[line - 1] = text;
  return lines.join("\n");
}

describe("parseLog refuses bad input with the line and column", () => {
  it("reads the good file, so each refusal below is caused by its one change", () => {
    const parsed = expectParsed(parseText(good));
    expect(parsed.rows).toBe(4);
    expect(Array.from(parsed.columns.timeS)).toEqual([0, 10, 20, 30]);
    expect(parsed.warnings).toEqual([]);
  });

  it("names a mapped column the header lacks", () => {
    const error = expectError(parseText(withLine(1, "Time (s),Step,Voltage (V),Current (A),Temp")));
    expect(error).toMatchObject({ code: "missing-column", line: 1, column: "Temperature (°C)" });
    expect(error.message).toMatch(/^Line 1, column "Temperature \(°C\)": the header has no column for temperature\. Its columns are "Time \(s\)"/);
  });

  it("counts metadata lines before the header in the line number", () => {
    const text = "Cycler: example unit\nChannel 4\n" + withLine(1, "Time (s),Step,Volts,Current (A),Temperature (°C)");
    const error = expectError(parseText(text, { ...defaultMapping, headerLine: 3 }));
    expect(error).toMatchObject({ code: "missing-column", line: 3, column: "Voltage (V)" });
  });

  it("refuses a cell that is not a number", () => {
    const error = expectError(parseText(withLine(4, "20.000,1,3.7x,1.50000,23.20")));
    expect(error).toMatchObject({ code: "non-numeric", line: 4, column: "Voltage (V)" });
    expect(error.message).toBe('Line 4, column "Voltage (V)": "3.7x" is not a number.');
  });

  it("refuses an empty cell, and hexadecimal or infinite values", () => {
    expect(expectError(parseText(withLine(3, "10.000,1,3.6500,,23.10")))).toMatchObject({ code: "non-numeric", line: 3, column: "Current (A)" });
    expect(expectError(parseText(withLine(3, "10.000,1,3.6500,0x1,23.10")))).toMatchObject({ code: "non-numeric", line: 3, column: "Current (A)" });
    expect(expectError(parseText(withLine(5, "30.000,1,3.7500,1.5,Infinity")))).toMatchObject({ code: "non-numeric", line: 5, column: "Temperature (°C)" });
  });

  it("finds a bad cell deep in a long file at its exact line, whole or in chunks", () => {
    const lines = formatCsv(makeLog()).split("\n");
    const target = Math.floor(lines.length * 0.7);
    const cells = (lines[target - 1] as string).split(",");
    cells[3] = "n/a";
    lines[target - 1] = cells.join(",");
    const text = lines.join("\n");
    expect(expectError(parseText(text))).toMatchObject({ code: "non-numeric", line: target, column: "Current (A)" });
    const bytes = encode(text);
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20 });
    for (let at = 0; at < bytes.length; at += 4096) parser.push(bytes.subarray(at, at + 4096));
    expect(expectError(parser.finish())).toMatchObject({ code: "non-numeric", line: target, column: "Current (A)" });
  });

  it("refuses time going backwards", () => {
    const error = expectError(parseText(withLine(4, "9.500,1,3.7000,1.50000,23.20")));
    expect(error).toMatchObject({ code: "time-backwards", line: 4, column: "Time (s)" });
    expect(error.message).toContain('"9.500" is earlier than the time on line 3');
  });

  it("refuses a duplicate timestamp on consecutive rows", () => {
    const mapping: ColumnMapping = { ...defaultMapping, time: { form: "timestamp", column: "Timestamp" } };
    const text = [
      "Timestamp,Step,Voltage (V),Current (A),Temperature (°C)",
      "2026-03-01 08:00:00,1,3.6,1.5,23",
      "2026-03-01 08:00:01,1,3.6,1.5,23",
      "2026-03-01 08:00:01,1,3.6,1.5,23",
    ].join("\n");
    const error = expectError(parseText(text, mapping));
    expect(error).toMatchObject({ code: "duplicate-time", line: 4, column: "Timestamp" });
    expect(error.message).toContain("repeats the time on line 3");
  });

  it("names the previous data row across a blank line", () => {
    const error = expectError(parseText(good.replace("\n20.000", "\n\n10.000")));
    expect(error).toMatchObject({ code: "duplicate-time", line: 5 });
    expect(error.message).toContain("line 3");
  });

  it("suspects a clock change when timestamps without offset step back about an hour", () => {
    const mapping: ColumnMapping = { ...defaultMapping, time: { form: "timestamp", column: "Timestamp" } };
    const text = [
      "Timestamp,Step,Voltage (V),Current (A),Temperature (°C)",
      "2026-10-25 02:59:30,1,3.6,1.5,23",
      "2026-10-25 02:59:50,1,3.6,1.5,23",
      "2026-10-25 02:00:10,1,3.6,1.5,23",
    ].join("\n");
    const error = expectError(parseText(text, mapping));
    expect(error).toMatchObject({ code: "time-backwards", line: 4, column: "Timestamp" });
    expect(error.message).toContain("about an hour");
    expect(expectError(parseText(withLine(4, "9.500,1,3.7000,1.50000,23.20"))).message).not.toContain("about an hour");
  });

  it("refuses a timestamp it cannot read", () => {
    const mapping: ColumnMapping = { ...defaultMapping, time: { form: "timestamp", column: "Timestamp" } };
    const text = "Timestamp,Step,Voltage (V),Current (A),Temperature (°C)\n2026-03-01 08:00:00,1,3.6,1.5,23\n01.03.2026 08:00:01,1,3.6,1.5,23\n";
    expect(expectError(parseText(text, mapping))).toMatchObject({ code: "non-numeric", line: 3, column: "Timestamp" });
  });

  it("refuses an empty file, a file of blank lines, and a header without rows", () => {
    expect(expectError(parseText(""))).toMatchObject({ code: "empty-file" });
    expect(expectError(parseText("\n \r\n\n"))).toMatchObject({ code: "empty-file" });
    expect(expectError(parseText(`${header}\n`))).toMatchObject({ code: "no-data-rows", line: 1 });
    expect(expectError(parseText(`${header}\r\n\r\n`))).toMatchObject({ code: "no-data-rows", line: 1 });
    expect(expectError(parseText(header))).toMatchObject({ code: "no-data-rows", line: 1 });
  });

  it("refuses a header line beyond the end of the file", () => {
    const error = expectError(parseText(good, { ...defaultMapping, headerLine: 9 }));
    expect(error).toMatchObject({ code: "header-not-found", line: 9 });
    expect(error.message).toContain("The file has 5 lines");
  });

  it("refuses a blank line where the header should be, once the file turns out to hold text", () => {
    const error = expectError(parseText(`\n${good}`));
    expect(error).toMatchObject({ code: "header-not-found", line: 1 });
    expect(error.message).toBe("Line 1: the line where the mapping expects the header is blank.");
  });

  it("tells an Excel workbook from a ZIP archive even when the bytes arrive one by one", () => {
    const bytes = Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 20, 0, 6, 0, ...encode("[Content_Types].xml....xl/workbook.xml"), ...new Uint8Array(5000)]);
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20 });
    let error = null;
    for (let k = 0; k < bytes.length && !error; k++) error = parser.push(bytes.subarray(k, k + 1));
    expect(error?.message).toMatch(/an Excel workbook \(\.xlsx\)/);
  });

  it("refuses a wrong delimiter and names the one the file uses", () => {
    const error = expectError(parseText(good.replaceAll(",", ";")));
    expect(error).toMatchObject({ code: "wrong-delimiter", line: 1 });
    expect(error.message).toContain("semicolons");
  });

  it("refuses a decimal comma when the mapping says decimal point, and the reverse", () => {
    const semicolons = { ...defaultMapping, delimiter: ";" } as const;
    const commaText = good.replaceAll(",", ";").replaceAll(".", ",");
    const error = expectError(parseText(commaText, semicolons));
    expect(error).toMatchObject({ code: "decimal-separator-mismatch", line: 2, column: "Time (s)" });
    expect(error.message).toContain("has a decimal comma, but the mapping says decimal point");

    const reverse = expectError(parseText(good.replaceAll(",", ";"), { ...semicolons, decimalSeparator: "," }));
    expect(reverse).toMatchObject({ code: "decimal-separator-mismatch", line: 2, column: "Time (s)" });
    expect(reverse.message).toContain("has a decimal point, but the mapping says decimal comma");
  });

  it("explains extra cells in a comma-separated file with decimal commas", () => {
    const error = expectError(parseText(withLine(2, "0,000,1,3,6000,1,50000,23,00")));
    expect(error).toMatchObject({ code: "cell-count", line: 2 });
    expect(error.message).toContain("has 9 cells, but the header (line 1) has 5");
    expect(error.message).toContain("decimal comma");
  });

  it("refuses a short or long row in the middle of the file", () => {
    expect(expectError(parseText(withLine(3, "10.000,1,3.6500,1.50000")))).toMatchObject({ code: "cell-count", line: 3 });
    expect(expectError(parseText(withLine(3, "10.000,1,3.6500,1.50000,23.10,7")))).toMatchObject({ code: "cell-count", line: 3 });
  });

  it("refuses a quote that is never closed", () => {
    expect(expectError(parseText(withLine(3, '10.000,1,"3.6500,1.50000,23.10')))).toMatchObject({ code: "unclosed-quote", line: 3 });
  });

  it("refuses a column name the header holds twice", () => {
    const error = expectError(parseText(withLine(1, "Time (s),Step,Voltage (V),Current (A),Voltage (V)")));
    expect(error).toMatchObject({ code: "ambiguous-column", line: 1, column: "Voltage (V)" });
  });

  it("refuses a cut-off last line instead of dropping it", () => {
    const text = good + "40.000,1,3.80";
    const error = expectError(parseText(text));
    expect(error).toMatchObject({ code: "truncated-last-line", line: 6 });
    expect(error.message).toContain("has 3 of the header's 5 cells and no line ending");
    // A complete last line without a line break is read.
    expect(expectParsed(parseText(good + "40.000,1,3.8000,1.50000,23.40")).rows).toBe(5);
  });

  it("refuses PDF, Excel, ZIP, older Office and other binary files by their first bytes", () => {
    const cases: [number[], RegExp][] = [
      [[...encode("%PDF-1.7\n%âãÏÓ\n")], /This is a PDF file, not a CSV text log/],
      [[0x50, 0x4b, 0x03, 0x04, 20, 0, 6, 0, ...encode("[Content_Types].xml....xl/workbook.xml")], /an Excel workbook \(\.xlsx\)/],
      [[0x50, 0x4b, 0x03, 0x04, 20, 0, 6, 0, ...encode("data/readme.txt")], /a ZIP archive/],
      [[0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0], /older Office file/],
      [[...encode("Time,Voltage\n0,3.7\n"), 0, 1, 2], /a binary file/],
      [[0xff, 0xfe, ...encode("T\0i\0m\0e\0")], /UTF-16 text.*Save the log as UTF-8/],
    ];
    for (const [bytes, message] of cases) {
      const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20 });
      parser.push(Uint8Array.from(bytes));
      const error = expectError(parser.finish());
      expect(error.code).toBe("wrong-file-type");
      expect(error.message).toMatch(message);
    }
  });

  it("refuses a NUL byte anywhere in the first 64 KiB, even after the first chunk", () => {
    const text = formatCsv(makeLog());
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20 });
    expect(parser.push(encode(text.slice(0, text.indexOf("\n", 20_000) + 1)))).toBeNull();
    expect(parser.push(Uint8Array.of(65, 0, 66))).toMatchObject({ code: "wrong-file-type" });
  });

  it("stops at the first chunk over the size limit and keeps nothing", () => {
    const text = formatCsv(makeLog());
    const bytes = encode(text);
    const limit = 10_000;
    const parser = createLogParser(defaultMapping, { maxBytes: limit });
    let pushed = 0;
    let error = null;
    for (let at = 0; at < bytes.length && !error; at += 1000) {
      error = parser.push(bytes.subarray(at, at + 1000));
      pushed += 1000;
    }
    expect(pushed).toBe(limit + 1000);
    expect(error?.code).toBe("too-large");
    expect(error?.message).toMatch(/^The file is larger than the limit of 9\.8 KiB; reading stopped at line \d+\.$/);
    expect(error?.line).toBeGreaterThan(100);
    expect(parser.finish()).toEqual({ ok: false, error });
  });

  it("refuses more rows than the limit, naming the first line over it", () => {
    expect(expectError(parseText(good, defaultMapping, { maxRows: 3 }))).toMatchObject({ code: "too-many-rows", line: 5 });
  });

  it("refuses an endless line without reading it into memory", () => {
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20, maxLineChars: 1000 });
    expect(parser.push(encode(`${header}\n`))).toBeNull();
    expect(parser.push(encode("1".repeat(600)))).toBeNull();
    expect(parser.push(encode("1".repeat(600)))).toMatchObject({ code: "line-too-long", line: 2 });
  });

  it("refuses an incomplete mapping before reading", () => {
    const mapping = { ...mapFormat(), decimalSeparator: "," } as ColumnMapping;
    const error = expectError(parseText(good, mapping));
    expect(error.code).toBe("invalid-mapping");
    expect(error.message).toContain("decimalSeparator: a decimal comma needs a delimiter other than a comma");
  });

  it("keeps refusing after a refusal, and finish gives the same error", () => {
    const parser = createLogParser(defaultMapping, { maxBytes: 1 << 20 });
    const first = parser.push(encode(withLine(3, "10.000,1,bad,1.5,23")));
    expect(first).toMatchObject({ code: "non-numeric", line: 3 });
    expect(parser.push(encode(rows.join("\n")))).toBe(first);
    expect(parser.finish()).toEqual({ ok: false, error: first });
  });
});
