import { describe, expect, it } from "vitest";
import { checkNextPart, describeDuration, readPartStart, type PartSpan } from "@/lib/runs/log-parts/part-sequence";
import type { ColumnMapping } from "@/lib/analysis/log-import";

const header = ["Time (s)", "Voltage (V)", "Current (A)"];
// Part 1: 0 … 3 599 s, one sample a second.
const first: PartSpan = { number: 1, firstS: 0, lastS: 3599, samples: 3600, header };

describe("checkNextPart", () => {
  it("accepts the first part of a log without comparing it to anything", () => {
    expect(checkNextPart(null, { firstS: 10, lastS: 20, samples: 11, header }, "elapsed")).toEqual({ ok: true, gapS: null });
  });

  it("accepts a part that follows on at the sampling interval, without a gap", () => {
    expect(checkNextPart(first, { firstS: 3600, lastS: 7199, samples: 3600, header }, "elapsed")).toEqual({ ok: true, gapS: null });
  });

  it("accepts a part after a pause and reports the pause as a gap with its length", () => {
    const fit = checkNextPart(first, { firstS: 3599 + 7500, lastS: 20000, samples: 100, header }, "elapsed");
    expect(fit).toEqual({ ok: true, gapS: 7500 });
  });

  it("does not call a pause of a few sample intervals a gap", () => {
    expect(checkNextPart(first, { firstS: 3599 + 9, lastS: 5000, samples: 10, header }, "elapsed")).toEqual({ ok: true, gapS: null });
  });

  it("refuses a part that starts inside the previous one, naming both times", () => {
    const fit = checkNextPart(first, { firstS: 3000, lastS: 5000, samples: 2001, header }, "elapsed");
    expect(fit.ok).toBe(false);
    if (!fit.ok) expect(fit.problem).toMatch(/overlaps part 1: it starts at 50 min 00 s elapsed, but part 1 runs until 59 min 59 s elapsed/);
  });

  it("refuses a part that repeats the previous part's last sample time", () => {
    expect(checkNextPart(first, { firstS: 3599, lastS: 5000, samples: 10, header }, "elapsed").ok).toBe(false);
  });

  it("refuses a part whose time lies before the previous part began (time going backwards)", () => {
    const later: PartSpan = { ...first, number: 2, firstS: 10_000, lastS: 12_000 };
    const fit = checkNextPart(later, { firstS: 100, lastS: 200, samples: 101, header }, "timestamp");
    expect(fit.ok).toBe(false);
    if (!fit.ok) expect(fit.problem).toMatch(/^Time goes backwards: this part starts at 1970-01-01 00:01:40 UTC, before part 2 started/);
  });

  it("refuses a part in another column layout and names the columns", () => {
    const fit = checkNextPart(first, { firstS: 3600, lastS: 4000, samples: 401, header: ["Time (s)", "Voltage (V)", "Current (mA)"] }, "elapsed");
    expect(fit.ok).toBe(false);
    if (!fit.ok) expect(fit.problem).toContain('"Current (mA)"');
  });

  it("refuses a part whose first time cannot be read", () => {
    expect(checkNextPart(first, { firstS: Number.NaN, lastS: Number.NaN, samples: 1, header }, "elapsed").ok).toBe(false);
  });
});

describe("readPartStart", () => {
  const elapsed = { time: { form: "elapsed", column: "t", unit: "h" }, decimalSeparator: ",", delimiter: ";" } as unknown as ColumnMapping;
  it("reads an elapsed time in its unit and decimal separator as seconds", () => {
    expect(readPartStart("1,5", elapsed)).toBe(5400);
  });
  it("reads a timestamp as Unix seconds", () => {
    const stamped = { ...elapsed, time: { form: "timestamp", column: "t" } } as ColumnMapping;
    expect(readPartStart("2026-12-01T10:00:00Z", stamped)).toBe(Date.UTC(2026, 11, 1, 10) / 1000);
  });
});

describe("describeDuration", () => {
  it("writes lengths of time as a person does", () => {
    expect(describeDuration(45)).toBe("45 s");
    expect(describeDuration(7500)).toBe("2 h 05 min");
    expect(describeDuration(90061)).toBe("1 d 1 h 01 min");
  });
});
