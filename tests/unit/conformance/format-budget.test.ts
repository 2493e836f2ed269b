import { describe, expect, it } from "vitest";
import { evaluateCapacityUncertainty, evaluateDcResistanceUncertainty } from "@/lib/analysis";
import { formatBudgetTable } from "@/lib/conformance";
import { formatMeasure, formatSignificant } from "@/lib/conformance/format-budget";

describe("formatting figures for a budget table", () => {
  it("keeps significant figures, groups thousands and writes a true minus", () => {
    expect(formatSignificant(0.0028, 3)).toBe("0.00280");
    expect(formatSignificant(18_360, 3)).toBe("18 360");
    expect(formatSignificant(-80.25, 4)).toBe("\u221280.25");
    expect(formatSignificant(0, 3)).toBe("0");
  });

  it("writes small readings with a prefix and capacity in mAh, units beside the values", () => {
    expect(formatMeasure(0.0028, "A")).toBe("2.80 mA");
    expect(formatMeasure(0.000327, "Ω")).toBe("327 µΩ");
    expect(formatMeasure(3.9, "V")).toBe("3.90 V");
    expect(formatMeasure(3.06, "Ah", 5)).toBe("3 060.0 mAh");
    expect(formatMeasure(1.836, "s")).toBe("1.84 s");
    expect(formatMeasure(0, "A")).toBe("0 A");
  });
});

describe("formatBudgetTable", () => {
  it("prints Example B (docs/references.md §6) row by row, then u_c, k and U", () => {
    const budget = evaluateCapacityUncertainty({
      capacityAh: 3.06,
      currentA: 0.6,
      durationS: 5.1 * 3600,
      sources: [
        { quantity: "current", source: "CH-07 current accuracy", tolerance: { form: "percent-of-reading-and-range", percentOfReading: 0.05, percentOfRange: 0.05, range: 5 } },
        { quantity: "time", source: "CH-07 time accuracy", tolerance: { form: "percent-of-reading", percent: 0.01 } },
      ],
    });
    if (!budget.ok) throw new Error(budget.error.message);
    const table = formatBudgetTable(budget.value);
    expect(table).toMatchObject({ measurand: "Capacity", value: "3 060.0 mAh", coverageFactor: "2", expanded: "±16.5 mAh", expandedPercent: "±0.539 %" });
    expect(table.rows[0]).toEqual({
      quantity: "current",
      source: "CH-07 current accuracy",
      statedLimit: "±(0.05 % of reading + 0.05 % of 5 A range)",
      halfWidth: "2.80 mA",
      distribution: "rectangular",
      divisor: "√3",
      standardUncertainty: "1.62 mA",
      relativeStandardUncertainty: "0.2694 %",
      sensitivity: "1",
      contribution: "0.2694 %",
    });
    // 100 ppm of 18 360 s is 1.836 s; u = 1.836 s / √3 = 1.06 s.
    expect(table.rows[1]).toMatchObject({ halfWidth: "1.84 s", standardUncertainty: "1.06 s", relativeStandardUncertainty: "0.005774 %" });
    expect(table.combined).toBe("8.25 mAh (0.2695 %)");
  });

  it("prints a pulse's signed sensitivities and its resistance in mΩ", () => {
    const budget = evaluateDcResistanceUncertainty({
      readings: { u1V: 3.9, i1A: -0.6, u2V: 3.852, i2A: -3 },
      voltage: { percentOfReading: 1, percentOfRange: 0.01, range: 5 },
      current: { percentOfReading: 1 },
      correlation: "same-channel",
    });
    if (!budget.ok) throw new Error(budget.error.message);
    const table = formatBudgetTable(budget.value);
    expect(table.measurand).toBe("DC resistance");
    expect(table.value).toBe("20.000 mΩ");
    expect(table.rows.map((row) => row.sensitivity)).toEqual(["1", "81.25", "\u221280.25", "\u22121"]);
    expect(table.rows[0]!.halfWidth).toBe("480 µV");
  });
});
