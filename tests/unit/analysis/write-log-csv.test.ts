import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { integrate } from "@/lib/analysis/integrate";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { generateSyntheticLog } from "@/lib/analysis/synthetic-log";
import { formatLogCsv, writeLogCsv, type CsvFormat } from "@/lib/analysis/write-log-csv";
import { createLog } from "./log-arbitrary";

const small = createLog([
  { t: 0, v: 3.6, i: 0, temperature: 23.4 },
  { t: 90, v: 3.55, i: -1.5, temperature: 23.6 },
  { t: 180.5, v: 3.5004, i: 0.25, temperature: 23.8 },
]);
small.cyclerStep = Float64Array.of(1, 2, 3);

/** A reader just good enough for our own files: header units, delimiter, decimal comma, current sign. */
function readBack(text: string, format: Partial<CsvFormat>): LogColumns {
  const delimiter = format.delimiter ?? ",";
  const [header, ...lines] = text.trimEnd().split("\n");
  const names = header!.split(delimiter);
  const scale = (name: string) => (/\((mA|mV)\)/.test(name) ? 1 / 1000 : /\(min\)/.test(name) ? 60 : /\(h\)/.test(name) ? 3600 : 1);
  const column = (prefix: string) => {
    const k = names.findIndex((n) => n.startsWith(prefix));
    const factor = scale(names[k]!) * (prefix === "Current" && format.dischargeCurrent === "positive" ? -1 : 1);
    return Float64Array.from(lines, (line) => Number(line.split(delimiter)[k]!.replace(",", ".")) * factor);
  };
  return { timeS: column("Time"), voltageV: column("Voltage"), currentA: column("Current"), length: lines.length };
}

describe("writeLogCsv", () => {
  it("writes a header with units and one row per sample", () => {
    const result = formatLogCsv(small);
    expect(result.ok && result.value).toBe(
      "Time (s),Step,Voltage (V),Current (A),Temperature (°C)\n" +
        "0.000,1,3.6000,0.00000,23.40\n" +
        "90.000,2,3.5500,-1.50000,23.60\n" +
        "180.500,3,3.5004,0.25000,23.80\n",
    );
  });

  it("writes mV, mA, hours, discharge positive, semicolons and decimal commas when asked", () => {
    const result = formatLogCsv(small, {
      columns: ["time", "voltage", "current"],
      time: { unit: "h", decimals: 4 },
      voltageUnit: "mV",
      currentUnit: "mA",
      dischargeCurrent: "positive",
      delimiter: ";",
      decimalSeparator: ",",
      lineEnding: "\r\n",
      headers: { time: "Test time (h)" },
    });
    expect(result.ok && result.value).toBe(
      "Test time (h);Voltage (mV);Current (mA)\r\n0,0000;3600,0;0,00\r\n0,0250;3550,0;1500,00\r\n0,0501;3500,4;-250,00\r\n",
    );
  });

  it("writes ISO 8601 timestamps from a given start instant", () => {
    const result = formatLogCsv(small, { columns: ["time", "current"], time: { unit: "iso", startEpochMs: Date.UTC(2026, 2, 1, 8, 0, 0) } });
    expect(result.ok && result.value.split("\n")[3]).toBe("2026-03-01T08:03:00.500Z,0.25000");
  });

  it("streams chunks that join to the same text", () => {
    const log = generateSyntheticLog({
      cell: { capacityMAh: 2000, seriesResistanceOhm: 0.03, initialSoc: 0.5 },
      steps: [{ kind: "discharge", currentA: 1, endVoltageV: 3.4 }],
      seed: 5,
      sampleIntervalS: 5,
    });
    expect(log.ok).toBe(true);
    if (!log.ok) return;
    const chunks = writeLogCsv(log.value.columns, { rowsPerChunk: 100 });
    expect(chunks.ok).toBe(true);
    if (!chunks.ok) return;
    const parts = Array.from(chunks.value);
    expect(parts.length).toBe(Math.ceil(log.value.columns.length / 100));
    expect(parts.every((p) => p.endsWith("\n"))).toBe(true);
    const whole = formatLogCsv(log.value.columns, { rowsPerChunk: 1_000_000 });
    expect(whole.ok && whole.value).toBe(parts.join(""));
    expect(parts.join("").split("\n").length).toBe(log.value.columns.length + 2);
  });

  it("gives the same capacity and energy whatever units, sign and separators the file uses", () => {
    const log = generateSyntheticLog({
      cell: { capacityMAh: 3000, seriesResistanceOhm: 0.03, initialSoc: 0.9 },
      steps: [
        { kind: "discharge", currentA: 1.5, endVoltageV: 3.3 },
        { kind: "rest", durationS: 300 },
        { kind: "charge", currentA: 1.5, voltageV: 4.1, terminationCurrentA: 0.1 },
      ],
      seed: 11,
      sampleIntervalS: 20,
    });
    expect(log.ok).toBe(true);
    if (!log.ok) return;
    const columns = log.value.columns;
    const reference = integrate(columns, { from: 0, to: columns.length - 1 });
    expect(reference.ok).toBe(true);
    if (!reference.ok) return;
    const formatArb = fc.record({
      time: fc.constantFrom<CsvFormat["time"]>({ unit: "s" }, { unit: "min" }, { unit: "h" }),
      voltageUnit: fc.constantFrom<CsvFormat["voltageUnit"]>("V", "mV"),
      currentUnit: fc.constantFrom<CsvFormat["currentUnit"]>("A", "mA"),
      dischargeCurrent: fc.constantFrom<CsvFormat["dischargeCurrent"]>("negative", "positive"),
      delimiter: fc.constantFrom<CsvFormat["delimiter"]>(";", "\t"),
      decimalSeparator: fc.constantFrom<CsvFormat["decimalSeparator"]>(".", ","),
    });
    fc.assert(
      fc.property(formatArb, (format) => {
        const text = formatLogCsv(columns, format);
        if (!text.ok) return false;
        const back = integrate(readBack(text.value, format), { from: 0, to: columns.length - 1 });
        if (!back.ok) return false;
        // Only the printed decimals differ: 10 µA, 0.1 mV and about 1 ms per value.
        const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
        return relative(back.value.capacityAh, reference.value.capacityAh) < 2e-6 && relative(back.value.energyWh, reference.value.energyWh) < 2e-6;
      }),
      { numRuns: 30 },
    );
  });

  it("refuses a decimal comma with a comma delimiter, and columns the log does not have", () => {
    const comma = writeLogCsv(small, { decimalSeparator: "," });
    expect(comma.ok || comma.error.code).toBe("invalid-input");
    const noTemperature = { ...small };
    delete noTemperature.temperatureC;
    const missing = writeLogCsv(noTemperature, { columns: ["time", "temperature"] });
    expect(missing.ok || missing.error.message).toContain("no temperature");
    const defaults = formatLogCsv(noTemperature);
    expect(defaults.ok && defaults.value.split("\n")[0]).toBe("Time (s),Step,Voltage (V),Current (A)");
  });
});
