import { describe, expect, it } from "vitest";
import { createLineFramer } from "@/lib/analysis/log-import/frame-lines";
import { createLogColumnStore } from "@/lib/analysis/log-import/log-column-store";
import type { LogImportError, LogImportWarning } from "@/lib/analysis/log-import/log-import-error";
import { createDataRows } from "@/lib/analysis/log-import/read-data-rows";
import { createHeaderLines } from "@/lib/analysis/log-import/read-header-lines";
import { createLogParser } from "@/lib/analysis/log-import";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { encode, formatCsv, makeLog, mapFormat } from "./log-fixtures";

function frame(parts: readonly Uint8Array[], limits: { maxBytes?: number; maxLineChars?: number } = {}) {
  const blocks: string[] = [];
  let error: LogImportError | null = null;
  let line = 1;
  const framer = createLineFramer({
    maxBytes: limits.maxBytes ?? 1 << 20,
    maxLineChars: limits.maxLineChars ?? 1000,
    nextLine: () => line,
    isRefused: () => error !== null,
    refuse: (e) => {
      error ??= e;
    },
    onBlock: (b) => {
      blocks.push(b);
      line += b.split("\n").length - 1;
    },
  });
  for (const p of parts) if (!error) framer.push(p);
  const last = error ? "" : framer.end();
  return { blocks, last, error: error as LogImportError | null, bytes: framer.bytes };
}

describe("line framing", () => {
  it("gives whole lines however the bytes are split, a multi-byte character included, and the unterminated last line", () => {
    const text = "a,b\n1,2 °C\r\n3,4\n5,6";
    const bytes = encode(text);
    for (let cut = 1; cut < bytes.length; cut++) {
      const r = frame([bytes.subarray(0, cut), bytes.subarray(cut)]);
      expect(r.error).toBeNull();
      expect(r.blocks.every((b) => b.endsWith("\n"))).toBe(true);
      expect(r.blocks.join("") + r.last).toBe(text);
    }
  });

  it("says a file with no bytes is empty (null), and refuses a PDF before decoding it", () => {
    expect(frame([]).last).toBeNull();
    const pdf = frame([encode("%PDF-1.7\n1 0 obj\n")]);
    expect(pdf.error?.code).toBe("wrong-file-type");
    expect(pdf.blocks).toEqual([]);
  });

  it("refuses a line longer than the limit and a file larger than the limit, naming the line", () => {
    const long = frame([encode("h\n"), encode("x".repeat(600)), encode("x".repeat(600))], { maxLineChars: 1000 });
    expect(long.error).toMatchObject({ code: "line-too-long", line: 2 });
    // The first eight bytes are held back to recognise the file type, so the first chunk here is nine.
    const big = frame([encode("time\n1\n2\n"), encode("3\n4\n5\n")], { maxBytes: 12 });
    expect(big.error).toMatchObject({ code: "too-large", line: 4 });
    expect(big.error?.message).toMatch(/12 bytes/);
  });
});

describe("header lines", () => {
  const mapping = { ...mapFormat({ columns: ["time", "voltage", "current"] }), headerLine: 2 };
  it("reads the header where the mapping says, and starts the data on the line after it", () => {
    const warnings: LogImportWarning[] = [];
    const refused: LogImportError[] = [];
    const h = createHeaderLines({ mapping, warnings, refuse: (e) => refused.push(e) });
    const header = formatCsv(makeLog(), { columns: ["time", "voltage", "current"] }).split("\n")[0]!;
    expect(h.read("Cycler export, channel 3", 1)).toBe(true);
    expect(h.found).toBeNull();
    expect(h.dataStarts).toBe(false);
    expect(h.read(header, 2)).toBe(true);
    expect(h.found?.indexes).toMatchObject({ time: 0, voltage: 1, current: 2 });
    expect(h.dataStarts).toBe(true);
    expect(refused).toEqual([]);
  });

  it("refuses text below a blank header line, naming the line the header was expected on", () => {
    const refused: LogImportError[] = [];
    const h = createHeaderLines({ mapping, warnings: [], refuse: (e) => refused.push(e) });
    expect(h.read("metadata", 1)).toBe(true);
    expect(h.read("   ", 2)).toBe(true);
    expect(h.read("1,2,3", 3)).toBe(false);
    expect(refused[0]).toMatchObject({ code: "header-not-found", line: 2 });
  });
});

describe("row reading and the column store", () => {
  const format = { columns: ["time", "voltage", "current"] as const };
  const mapping = mapFormat({ columns: [...format.columns] });
  const lines = formatCsv(makeLog(), { columns: [...format.columns] }).split("\n");
  const header = lines[0]!.split(",");
  const indexes = { time: 0, voltage: 1, current: 2, temperature: -1, step: -1, capacity: -1 };

  function reader() {
    const refused: LogImportError[] = [];
    const store = createLogColumnStore({ mapping, indexes, maxRows: Number.POSITIVE_INFINITY });
    const rows = createDataRows({ mapping, header, indexes, store, maxRows: Number.POSITIVE_INFINITY, isRefused: () => refused.length > 0, refuse: (e) => refused.push(e) });
    return { store, rows, refused };
  }

  it("reads a block of rows, counts its lines, and tells blank lines apart from a bad cell", () => {
    const { store, rows, refused } = reader();
    expect(rows.readBlock(`${lines[1]}\n${lines[2]}\n\n${lines[3]}\n`, 2)).toBe(4);
    expect(store.length).toBe(3);
    expect(rows.firstTime).toBe(lines[1]!.split(",")[0]);
    expect(rows.blankLinesWarning()).toMatchObject({ line: 4 });
    rows.readBlock(`${lines[4]}\n${lines[5]!.replace(/,[^,]*,/, ",volts,")}\n`, 6);
    expect(refused[0]).toMatchObject({ code: "non-numeric", line: 7 });
    // The good line before it was kept by the row reader; dropping all is the parser's part on refusal.
    expect(store.length).toBe(4);
  });

  it("copies rows out early exactly as they will be at the end (time from the first sample, in seconds)", () => {
    const { store, rows } = reader();
    rows.readBlock(lines.slice(1, 200).join("\n") + "\n", 2);
    const early = store.copyRows(50, 150);
    const { columns } = store.finish();
    expect(Array.from(early.timeS)).toEqual(Array.from(columns.timeS.subarray(50, 150)));
    expect(Array.from(early.voltageV)).toEqual(Array.from(columns.voltageV.subarray(50, 150)));
    expect(columns.timeS[0]).toBe(0);
  });
});

describe("rows handed out while reading", () => {
  it("adds up to the whole log, in order, wherever the bytes are split", () => {
    const mapping = mapFormat();
    const bytes = encode(formatCsv(makeLog({ sampleIntervalS: 5 })));
    for (const [chunkSize, rowsPerPart] of [[997, 100], [4096, 1000], [1 << 16, 7]] as const) {
      const parts: { first: number; columns: LogColumns }[] = [];
      const parser = createLogParser(mapping, { maxBytes: 1 << 24, rowsPerPart, onRows: (p) => parts.push(p) });
      for (let at = 0; at < bytes.length; at += chunkSize) expect(parser.push(bytes.subarray(at, at + chunkSize))).toBeNull();
      const result = parser.finish();
      if (!result.ok) throw new Error(result.error.message);
      let first = 0;
      for (const p of parts) {
        expect(p.first).toBe(first);
        expect(Array.from(p.columns.timeS)).toEqual(Array.from(result.columns.timeS.subarray(first, first + p.columns.length)));
        expect(Array.from(p.columns.currentA)).toEqual(Array.from(result.columns.currentA.subarray(first, first + p.columns.length)));
        first += p.columns.length;
      }
      expect(first).toBe(result.rows);
      expect(parts.slice(0, -1).every((p) => p.columns.length === rowsPerPart)).toBe(true);
    }
  });
});
