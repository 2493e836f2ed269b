import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readHeaderName, sniffLog, type LogSniff } from "@/lib/analysis/log-import";
import { encode } from "./log-fixtures";

function sniff(text: string, isWholeFile = true): LogSniff {
  const result = sniffLog(encode(text), { isWholeFile });
  if (!result.ok) throw new Error(`${result.error.code}: ${result.error.message}`);
  return result.value;
}

function sniffError(bytes: Uint8Array | string, isWholeFile = true) {
  const result = sniffLog(typeof bytes === "string" ? encode(bytes) : bytes, { isWholeFile });
  if (result.ok) throw new Error("expected the sniff to fail");
  return result.error;
}

const rows = (delimiter: string, decimal: string) =>
  ["0", "10", "20", "30"].map((t, k) => [t, `3${decimal}70${k}`, `-1${decimal}5`, `23${decimal}1`].join(delimiter)).join("\n") + "\n";

describe("sniffLog finds the layout", () => {
  it.each([
    [",", "."],
    [";", "."],
    [";", ","],
    ["\t", "."],
    ["\t", ","],
  ])("delimiter %j with decimal %j", (delimiter, decimal) => {
    const found = sniff(["Time (s)", "Voltage (V)", "Current (A)", "Temperature (°C)"].join(delimiter) + "\n" + rows(delimiter, decimal));
    expect(found).toMatchObject({ delimiter, decimalSeparator: decimal, headerLine: 1, dataStartLine: 2, hasByteOrderMark: false, lineEnding: "\n" });
    expect(found.columns).toEqual(["Time (s)", "Voltage (V)", "Current (A)", "Temperature (°C)"]);
    expect(found.preview[0]).toEqual({ line: 2, cells: ["0", `3${decimal}700`, `-1${decimal}5`, `23${decimal}1`] });
  });

  it("skips metadata lines before the header, even ones with the delimiter in them", () => {
    const text = "\uFEFFTest report;invented cycler\r\nChannel;3\r\nStart;2026-03-01 08:00:00\r\n\r\nTime (s);Voltage (V);Current (A);Temperature (°C)\r\n" + rows(";", ",").replaceAll("\n", "\r\n");
    const found = sniff(text);
    expect(found).toMatchObject({ hasByteOrderMark: true, lineEnding: "\r\n", delimiter: ";", decimalSeparator: ",", headerLine: 5, dataStartLine: 6 });
    expect(found.metadataLines).toEqual(["Test report;invented cycler", "Channel;3", "Start;2026-03-01 08:00:00", ""]);
    expect(found.preview.map((row) => row.line)).toEqual([6, 7, 8, 9]);
  });

  it("finds the header above a units row and starts the data after it", () => {
    const found = sniff("Time,Voltage,Current,Temperature\ns,V,A,°C\n" + rows(",", "."));
    expect(found).toMatchObject({ headerLine: 1, dataStartLine: 3, columns: ["Time", "Voltage", "Current", "Temperature"] });
    expect(found.proposal.draft.dataStartLine).toBe(3);
  });

  it("reads quoted header names", () => {
    const found = sniff('"Time (s)","Voltage (V)","Current (A)","Temp"\n' + rows(",", "."));
    expect(found.columns).toEqual(["Time (s)", "Voltage (V)", "Current (A)", "Temp"]);
  });

  it("ignores a cut line at the end of the bytes it was given, unless they are the whole file", () => {
    const text = "Time (s),Voltage (V),Current (A)\n0,3.7,1\n1,3.7,1\n2,3.";
    expect(sniff(text, false).preview).toHaveLength(2);
    // The whole file's cut line is shown as it is; the parser refuses it.
    expect(sniff(text, true).preview.at(-1)).toEqual({ line: 4, cells: ["2", "3."] });
    expect(sniff("Time (s),Voltage (V),Current (A)\n0,3.7,1\n1,3.7,1", true).preview).toHaveLength(2);
  });

  it("shows at most the asked number of preview rows", () => {
    const text = "Time (s),Voltage (V),Current (A)\n" + Array.from({ length: 50 }, (_, k) => `${k},3.7,1`).join("\n") + "\n";
    const result = sniffLog(encode(text), { previewRows: 5, isWholeFile: true });
    expect(result.ok && result.value.preview.map((row) => row.cells[0])).toEqual(["0", "1", "2", "3", "4"]);
  });
});

describe("sniffLog refuses what is not a log", () => {
  it("names PDF, Excel and binary files", () => {
    expect(sniffError(encode("%PDF-1.4\n1 0 obj")).message).toMatch(/^This is a PDF file, not a CSV text log\./);
    expect(sniffError(Uint8Array.from([0x50, 0x4b, 0x03, 0x04, ...encode("xxxx[Content_Types].xml xl/styles.xml")])).message).toMatch(/Excel workbook/);
    expect(sniffError(Uint8Array.from([1, 2, 0, 4])).code).toBe("wrong-file-type");
  });

  it("refuses an empty file, blank lines, words without numbers, and numbers without a header", () => {
    expect(sniffError("").code).toBe("empty-file");
    expect(sniffError("\n\r\n  \n").code).toBe("empty-file");
    expect(sniffError("This is a note.\nNothing to see.\n").code).toBe("no-data-rows");
    expect(sniffError("0,3.7,1\n1,3.7,1\n")).toMatchObject({ code: "header-not-found", line: 1 });
  });

  it("refuses 64 KiB without a line break", () => {
    expect(sniffError("1".repeat(65536), false).code).toBe("line-too-long");
  });

  it("never throws on arbitrary bytes", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 2000 }), fc.boolean(), (bytes, isWholeFile) => {
        const result = sniffLog(bytes, { isWholeFile });
        expect(typeof result.ok).toBe("boolean");
      }),
      { numRuns: 300 },
    );
  });
});

describe("proposed mapping from header names", () => {
  it("splits names and units in several spellings", () => {
    expect(readHeaderName("Voltage(V)")).toMatchObject({ words: "voltage", unit: "v" });
    expect(readHeaderName("Current [mA]")).toMatchObject({ words: "current", unit: "ma" });
    expect(readHeaderName("U/V")).toMatchObject({ words: "u", unit: "v" });
    expect(readHeaderName("Test_Time(s)")).toMatchObject({ words: "test time", unit: "s" });
    expect(readHeaderName("Capacity_mAh")).toMatchObject({ words: "capacity", unit: "mah" });
    expect(readHeaderName("Temperature")).toMatchObject({ words: "temperature", unit: "" });
  });

  it.each([
    ["Test_Time(s),Step_Index,Voltage(V),Current(A),Temperature(°C),Charge_Capacity(Ah)", { form: "elapsed", unit: "s", column: "Test_Time(s)" }, "V", "A", true],
    ["Total Time [h],U/V,I/mA,Step", { form: "elapsed", unit: "h", column: "Total Time [h]" }, "V", "mA", false],
    ["Step Time (s),Elapsed time [min],Voltage [mV],Current [mA],Temp 1", { form: "elapsed", unit: "min", column: "Elapsed time [min]" }, "mV", "mA", true],
  ])("%s", (headerText, time, voltageUnit, currentUnit, hasTemperature) => {
    const count = headerText.split(",").length;
    const data = Array.from({ length: 3 }, (_, k) => Array.from({ length: count }, (_, c) => (c === 0 ? String(k) : voltageUnit === "mV" && c === 2 ? "3700.5" : "1.5")).join(","));
    const { draft, notes } = sniff(`${headerText}\n${data.join("\n")}\n`).proposal;
    expect(draft.time).toEqual(time);
    expect(draft.voltage?.unit).toBe(voltageUnit);
    expect(draft.current?.unit).toBe(currentUnit);
    expect(draft.current?.dischargeSign).toBe("negative");
    expect(draft.temperature !== undefined).toBe(hasTemperature);
    expect(notes.some((note) => note.includes("Discharge current is assumed to be written negative"))).toBe(true);
  });

  it("takes a column of timestamps as the time when there is no elapsed time", () => {
    const { draft } = sniff("Date Time;Step;Voltage (V);Current (A)\n2026-03-01 08:00:00;1;3,70;1,5\n2026-03-01 08:00:10;1;3,71;1,5\n").proposal;
    expect(draft.time).toEqual({ form: "timestamp", column: "Date Time" });
    expect(draft.step).toEqual({ column: "Step" });
  });

  it("guesses millivolts from the values when the header has no unit, and says so", () => {
    const { draft, notes } = sniff("Time,Voltage,Current\n0,3712.5,1500\n1,3713.0,1500\n").proposal;
    expect(draft.voltage).toEqual({ column: "Voltage", unit: "mV" });
    expect(notes).toContain('The header "Voltage" gives no unit; the values suggest mV.');
    expect(notes).toContain('The header "Time" gives no time unit; seconds are assumed.');
    expect(notes).toContain('The header "Current" gives no unit; A is assumed. Check it.');
  });

  it("leaves a role open when no column fits, and says so", () => {
    const { draft, notes } = sniff("Zeit,Spannung,Strom\n0,3.7,1\n1,3.7,1\n").proposal;
    expect(draft.voltage).toBeUndefined();
    expect(notes.at(-1)).toBe("No column was recognised for time, voltage, current: choose it by hand.");
  });
});
