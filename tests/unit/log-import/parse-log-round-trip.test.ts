import { describe, expect, it } from "vitest";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { columnMappingSchema, sniffLog, type ColumnMapping } from "@/lib/analysis/log-import";
import type { CsvFormat } from "@/tests/support/synthetic-log";
import { encode, expectParsed, formatCsv, makeLog, mapFormat, maxDifference, parseText } from "./log-fixtures";

interface Case {
  name: string;
  format: Partial<CsvFormat>;
  /** Lines written before the header, as some cyclers do. */
  metadata?: string[];
  byteOrderMark?: boolean;
  /** Largest error the printed decimals allow, per column, in SI units. */
  timeS: number;
  voltageV: number;
  currentA: number;
}

const start = Date.UTC(2026, 2, 1, 8, 0, 0);

const cases: Case[] = [
  { name: "seconds, V, A, commas", format: {}, timeS: 5e-4, voltageV: 5e-5, currentA: 5e-6 },
  {
    name: "minutes, mV, mA, discharge positive, semicolons, decimal comma, CRLF",
    format: { time: { unit: "min" }, voltageUnit: "mV", currentUnit: "mA", dischargeCurrent: "positive", delimiter: ";", decimalSeparator: ",", lineEnding: "\r\n" },
    timeS: 3e-4,
    voltageV: 5e-5,
    currentA: 5e-6,
  },
  {
    name: "hours, tabs, byte order mark, metadata lines before the header",
    format: { time: { unit: "h" }, delimiter: "\t" },
    metadata: ["Exported by an invented cycler", "Channel\t7", ""],
    byteOrderMark: true,
    timeS: 1.8e-4,
    voltageV: 5e-5,
    currentA: 5e-6,
  },
  {
    name: "ISO 8601 timestamps without step and temperature",
    format: { time: { unit: "iso", startEpochMs: start }, columns: ["time", "voltage", "current"] },
    timeS: 5e-4,
    voltageV: 5e-5,
    currentA: 5e-6,
  },
  {
    name: "ISO 8601 timestamps with semicolons, decimal comma, mA discharge positive",
    format: { time: { unit: "iso", startEpochMs: start }, delimiter: ";", decimalSeparator: ",", currentUnit: "mA", dischargeCurrent: "positive" },
    timeS: 5e-4,
    voltageV: 5e-5,
    currentA: 5e-6,
  },
];

const log = makeLog();

function writeCase(c: Case): string {
  const lineEnding = c.format.lineEnding ?? "\n";
  const preamble = (c.metadata ?? []).map((line) => line + lineEnding).join("");
  return (c.byteOrderMark ? "\uFEFF" : "") + preamble + formatCsv(log, c.format);
}

function mappingFor(c: Case): ColumnMapping {
  return mapFormat(c.format, { headerLine: (c.metadata?.length ?? 0) + 1 });
}

function expectSameLog(parsed: LogColumns, c: Case): void {
  expect(parsed.length).toBe(log.length);
  expect(maxDifference(parsed.timeS, log.timeS)).toBeLessThanOrEqual(c.timeS + 1e-9);
  expect(maxDifference(parsed.voltageV, log.voltageV)).toBeLessThanOrEqual(c.voltageV + 1e-12);
  expect(maxDifference(parsed.currentA, log.currentA)).toBeLessThanOrEqual(c.currentA + 1e-12);
  const columns = c.format.columns ?? ["time", "cyclerStep", "voltage", "current", "temperature"];
  if (columns.includes("temperature")) expect(maxDifference(parsed.temperatureC as Float64Array, log.temperatureC as Float64Array)).toBeLessThanOrEqual(5e-3 + 1e-12);
  else expect(parsed.temperatureC).toBeUndefined();
  if (columns.includes("cyclerStep")) expect(Array.from(parsed.cyclerStep as Float64Array)).toEqual(Array.from(log.cyclerStep as Float64Array));
  else expect(parsed.cyclerStep).toBeUndefined();
}

describe("parseLog reads back what writeLogCsv wrote", () => {
  it("uses a log with charge (positive current), rest and discharge (negative current)", () => {
    expect(log.length).toBeGreaterThan(1000);
    expect(log.currentA.some((i) => i > 1)).toBe(true);
    expect(log.currentA.some((i) => i < -0.5)).toBe(true);
  });

  for (const c of cases) {
    it(`${c.name}: same columns in SI within print rounding`, () => {
      const text = writeCase(c);
      const parsed = expectParsed(parseText(text, mappingFor(c)));
      expectSameLog(parsed.columns, c);
      expect(parsed.bytes).toBe(encode(text).length);
      expect(parsed.rows).toBe(log.length);
      expect(parsed.warnings).toEqual([]);
      expect(parsed.firstTime).toMatch(c.format.time?.unit === "iso" ? /^2026-03-01T08:00:00\.000Z$/ : /^0[.,]0+$/);
    });

    it(`${c.name}: sniffing the first 64 KiB proposes the mapping that reads it`, () => {
      const bytes = encode(writeCase(c));
      const sniffed = sniffLog(bytes.subarray(0, 64 * 1024));
      if (!sniffed.ok) throw new Error(sniffed.error.message);
      const expected = mappingFor(c);
      expect(sniffed.value.hasByteOrderMark).toBe(Boolean(c.byteOrderMark));
      expect(sniffed.value.lineEnding).toBe(c.format.lineEnding ?? "\n");
      expect(sniffed.value.metadataLines).toEqual(c.metadata ?? []);
      const proposed = columnMappingSchema.parse(sniffed.value.proposal.draft);
      // The sign of discharge current cannot be told from the file; the operator confirms it.
      expect(proposed).toEqual({ ...expected, current: { ...expected.current, dischargeSign: "negative" } });
    });
  }

  it("reads a CRLF file with blank lines in it, and warns about them", () => {
    const text = formatCsv(log, { lineEnding: "\r\n" }).replace(/\r\n/, "\r\n\r\n").replace(/\r\n$/, "\r\n\r\n\r\n");
    const parsed = expectParsed(parseText(text));
    expectSameLog(parsed.columns, cases[0] as Case);
    expect(parsed.warnings).toEqual([{ code: "blank-lines-skipped", line: 2, message: "3 blank lines (the first on line 2) were skipped." }]);
  });

  it("reads quoted cells, and a units row between header and data", () => {
    const plain = formatCsv(log, { delimiter: ";", decimalSeparator: "," });
    const [first, ...rest] = plain.split("\n");
    const quoted = [first, "s;;V;A;°C", ...rest.map((line) => (line === "" ? line : line.split(";").map((cell) => `"${cell}"`).join(";")))].join("\n");
    const mapping = { ...mapFormat({ delimiter: ";", decimalSeparator: "," }), dataStartLine: 3 };
    const parsed = expectParsed(parseText(quoted, mapping));
    expectSameLog(parsed.columns, cases[0] as Case);
    expect(parsed.warnings).toEqual([{ code: "lines-before-data-skipped", line: 2, message: "Line 2, between the header and the data, was skipped." }]);
  });

  it("keeps the cycler's capacity column in Ah for cross-checking", () => {
    const text = "Time (s);Voltage (V);Current (A);Capacity (mAh)\n0;3,70;-1,5;0,0\n10;3,69;-1,5;4,2\n";
    const mapping: ColumnMapping = { ...mapFormat({ columns: ["time", "voltage", "current"], delimiter: ";", decimalSeparator: "," }), capacity: { column: "Capacity (mAh)", unit: "mAh" } };
    const parsed = expectParsed(parseText(text, mapping));
    expect(Array.from(parsed.capacityAh as Float64Array)).toEqual([0, 0.0042]);
    expect(Array.from(parsed.columns.currentA)).toEqual([-1.5, -1.5]);
  });

  it("counts time from the first sample, and reads timestamps with offsets as instants", () => {
    const elapsed = expectParsed(parseText("Time (min),Voltage (V),Current (A)\n90,3.7,1\n90.5,3.7,1\n", mapFormat({ time: { unit: "min" }, columns: ["time", "voltage", "current"] })));
    expect(Array.from(elapsed.columns.timeS)).toEqual([0, 30]);
    expect(elapsed.firstTime).toBe("90");
    const stamped = expectParsed(
      parseText(
        "Timestamp,Voltage (V),Current (A)\n2026-03-29T01:59:30+01:00,3.7,1\n2026-03-29T03:00:00+02:00,3.7,1\n2026-03-29 01:00:31Z,3.7,1\n",
        mapFormat({ time: { unit: "iso", startEpochMs: 0 }, columns: ["time", "voltage", "current"] }),
      ),
    );
    expect(Array.from(stamped.columns.timeS)).toEqual([0, 30, 61]);
  });
});
