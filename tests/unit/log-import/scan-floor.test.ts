import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createScanFloor } from "@/lib/analysis/log-import";
import { encode, expectParsed, formatCsv, makeLog, maxDifference, parseText, splitAt } from "./log-fixtures";

const log = makeLog();
const bytes = encode(formatCsv(log));

function scan(chunks: Uint8Array[]) {
  const floor = createScanFloor({ columnCount: 5, skipLines: 1 });
  for (const chunk of chunks) floor.push(chunk);
  return floor.finish();
}

describe("createScanFloor (the benchmark's floor)", () => {
  it("reads the same numbers as the real parser, to rounding in the last digit", () => {
    const { columns, rows } = scan([bytes]);
    const parsed = expectParsed(parseText(formatCsv(log)));
    expect(rows).toBe(log.length);
    expect(maxDifference(columns[0] as Float64Array, parsed.columns.timeS)).toBeLessThan(1e-9);
    expect(Array.from(columns[1] as Float64Array)).toEqual(Array.from(parsed.columns.cyclerStep as Float64Array));
    expect(maxDifference(columns[2] as Float64Array, parsed.columns.voltageV)).toBeLessThan(1e-12);
    expect(maxDifference(columns[3] as Float64Array, parsed.columns.currentA)).toBeLessThan(1e-12);
    expect(maxDifference(columns[4] as Float64Array, parsed.columns.temperatureC as Float64Array)).toBeLessThan(1e-12);
  });

  it("gives the same columns wherever the bytes are split", () => {
    const whole = scan([bytes]);
    fc.assert(
      fc.property(fc.array(fc.nat({ max: bytes.length }), { maxLength: 20 }), (cuts) => {
        expect(scan(splitAt(bytes, cuts))).toEqual(whole);
      }),
      { numRuns: 12 },
    );
  });

  it("reads a last line without a line break", () => {
    const floor = createScanFloor({ columnCount: 2, skipLines: 1, delimiter: ";" });
    floor.push(encode("a;b\n1.5;-2\n3;4.25"));
    expect(floor.finish()).toEqual({ columns: [Float64Array.of(1.5, 3), Float64Array.of(-2, 4.25)], rows: 2 });
  });
});
