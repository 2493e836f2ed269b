import { describe, expect, it } from "vitest";
import { columnMappingSchema, getDataStartLine, listMappedColumns, type ColumnMapping } from "@/lib/analysis/log-import";

const mapping: ColumnMapping = {
  time: { form: "elapsed", column: "Test Time (s)", unit: "s" },
  voltage: { column: "Voltage (mV)", unit: "mV" },
  current: { column: "Current (mA)", unit: "mA", dischargeSign: "positive" },
  temperature: { column: "Temp (°C)" },
  step: { column: "Step" },
  capacity: { column: "Capacity (mAh)", unit: "mAh" },
  delimiter: ";",
  decimalSeparator: ",",
  headerLine: 4,
  dataStartLine: 6,
};

function issues(input: unknown): string[] {
  const result = columnMappingSchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
}

describe("columnMappingSchema", () => {
  it("accepts a full mapping and survives a JSON round trip (saved per instrument)", () => {
    expect(columnMappingSchema.parse(JSON.parse(JSON.stringify(mapping)))).toEqual(mapping);
    expect(issues({ ...mapping, time: { form: "timestamp", column: "Date" } })).toEqual([]);
  });

  it("trims column names", () => {
    expect(columnMappingSchema.parse({ ...mapping, step: { column: "  Step " } }).step).toEqual({ column: "Step" });
  });

  it("refuses a decimal comma with a comma delimiter", () => {
    expect(issues({ ...mapping, delimiter: "," })).toEqual(["decimalSeparator: a decimal comma needs a delimiter other than a comma"]);
  });

  it("refuses one column used for two roles", () => {
    expect(issues({ ...mapping, temperature: { column: "Voltage (mV)" } })).toEqual(['temperature.column: column "Voltage (mV)" is already used for voltage']);
  });

  it("refuses data that does not start after the header, and line 0", () => {
    expect(issues({ ...mapping, dataStartLine: 4 })).toEqual(["dataStartLine: data must start after the header line"]);
    expect(issues({ ...mapping, headerLine: 0, dataStartLine: undefined })).toEqual(["headerLine: lines are counted from 1"]);
  });

  it("refuses missing roles, unknown units and unknown keys", () => {
    const { current, ...withoutCurrent } = mapping;
    expect(current).toBeDefined();
    expect(issues(withoutCurrent)).toHaveLength(1);
    expect(issues({ ...mapping, voltage: { column: "Voltage (mV)", unit: "kV" } })).toHaveLength(1);
    expect(issues({ ...mapping, current: { column: "Current (mA)", unit: "mA" } })).toEqual([expect.stringMatching(/^current\.dischargeSign: /)]);
    expect(issues({ ...mapping, time: { form: "elapsed", column: "T", unit: "d" } })).toHaveLength(1);
    expect(issues({ ...mapping, colour: "red" })).toHaveLength(1);
    expect(issues({ ...mapping, voltage: { column: "  ", unit: "V" } })).toEqual(["voltage.column: choose a column"]);
  });

  it("lists the mapped columns by role, and finds where data starts", () => {
    expect(listMappedColumns(mapping)).toEqual([
      ["time", "Test Time (s)"],
      ["voltage", "Voltage (mV)"],
      ["current", "Current (mA)"],
      ["temperature", "Temp (°C)"],
      ["step", "Step"],
      ["capacity", "Capacity (mAh)"],
    ]);
    expect(getDataStartLine(mapping)).toBe(6);
    expect(getDataStartLine({ headerLine: 4 })).toBe(5);
  });
});
