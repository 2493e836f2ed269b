import { describe, expect, it } from "vitest";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { createLogParser } from "@/lib/analysis/log-import";
import { generateSyntheticLog, writeLogCsv } from "@/tests/support/synthetic-log";
import { defaultMapping, maxDifference } from "./log-fixtures";

const rowCount = 200_000;

function makeLongLog(): LogColumns {
  const log = generateSyntheticLog({
    cell: { capacityMAh: 3000, seriesResistanceOhm: 0.03, initialSoc: 0.1 },
    steps: [
      { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.15 },
      { kind: "rest", durationS: 3600 },
      { kind: "discharge", currentA: 0.6, endVoltageV: 3.0 },
    ],
    seed: 11,
    sampleIntervalS: 0.1,
    temperature: { ambientC: 23 },
  });
  if (!log.ok) throw new Error(log.error.message);
  const c = log.value.columns;
  expect(c.length).toBeGreaterThanOrEqual(rowCount);
  return {
    timeS: c.timeS.subarray(0, rowCount),
    voltageV: c.voltageV.subarray(0, rowCount),
    currentA: c.currentA.subarray(0, rowCount),
    temperatureC: (c.temperatureC as Float64Array).subarray(0, rowCount),
    cyclerStep: (c.cyclerStep as Float64Array).subarray(0, rowCount),
    length: rowCount,
  };
}

describe("parseLog on a long log", () => {
  it("streams 200 000 rows written chunk by chunk, never holding the whole text", () => {
    const log = makeLongLog();
    const written = writeLogCsv(log, { rowsPerChunk: 2000 });
    if (!written.ok) throw new Error(written.error.message);
    const encoder = new TextEncoder();
    let pushes = 0;
    let lastRows = 0;
    const parser = createLogParser(defaultMapping, {
      maxBytes: 64 * 2 ** 20,
      maxRows: rowCount,
      onProgress: ({ rows }) => {
        expect(rows).toBeGreaterThanOrEqual(lastRows);
        lastRows = rows;
        pushes++;
      },
    });
    for (const text of written.value) expect(parser.push(encoder.encode(text))).toBeNull();
    const parsed = parser.finish();
    if (!parsed.ok) throw new Error(parsed.error.message);
    expect(pushes).toBe(rowCount / 2000);
    expect(parsed.rows).toBe(rowCount);
    expect(parsed.bytes).toBeGreaterThan(rowCount * 25);
    expect(maxDifference(parsed.columns.timeS, log.timeS)).toBeLessThanOrEqual(5e-4 + 1e-9);
    expect(maxDifference(parsed.columns.voltageV, log.voltageV)).toBeLessThanOrEqual(5e-5 + 1e-12);
    expect(maxDifference(parsed.columns.currentA, log.currentA)).toBeLessThanOrEqual(5e-6 + 1e-12);
    expect(maxDifference(parsed.columns.temperatureC as Float64Array, log.temperatureC as Float64Array)).toBeLessThanOrEqual(5e-3 + 1e-12);
  });
});
