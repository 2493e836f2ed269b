import { describe, expect, it } from "vitest";
import { describeResults, histogram } from "@/lib/statistics";

function summariseValues(values: number[], extra: { rated?: number; minimum?: number } = {}) {
  const result = describeResults({ values, unit: "mAh", ...extra });
  if (!result.ok) throw new Error(result.error.message);
  return result.value;
}

describe("describeResults against simple-statistics' documented examples (node_modules/simple-statistics/src, @example)", () => {
  it("sampleStandardDeviation([2, 4, 4, 4, 5, 5, 7, 9]).toFixed(2) → '2.14' (sample_standard_deviation.js)", () => {
    const d = summariseValues([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(d.standardDeviation.toFixed(2)).toBe("2.14");
    // Arithmetic: mean 40 / 8 = 5; squared deviations 9+1+1+1+0+0+4+16 = 32; s = √(32 / 7) = 2.13809.
    expect(d.mean).toBe(5);
    expect(d.standardDeviation).toBeCloseTo(Math.sqrt(32 / 7), 12);
  });

  it("mean([0, 10]) → 5 (mean.js)", () => {
    expect(summariseValues([0, 10]).mean).toBe(5);
  });

  it("min([1, 5, -10, 100, 2]) → -10 (min.js); median([10, 2, 5, 100, 2, 1]) → 3.5 (median.js); max([1, 2, 3, 4]) → 4 (max.js)", () => {
    expect(summariseValues([1, 5, -10, 100, 2]).min).toBe(-10);
    expect(summariseValues([10, 2, 5, 100, 2, 1]).median).toBe(3.5);
    expect(summariseValues([1, 2, 3, 4]).max).toBe(4);
  });

  it("sampleVariance([1, 2, 3, 4, 5]) → 2.5 (sample_variance.js), so s = √2.5", () => {
    expect(summariseValues([1, 2, 3, 4, 5]).standardDeviation).toBeCloseTo(Math.sqrt(2.5), 14);
  });

  it("equalIntervalBreaks([1, 2, 3, 4, 5, 6], 4) → [1, 2.25, 3.5, 4.75, 6] (equal_interval_breaks.js) as histogram edges", () => {
    const result = histogram({ values: [1, 2, 3, 4, 5, 6], binCount: 4 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.bins.map((b) => b.from)).toEqual([1, 2.25, 3.5, 4.75]);
    expect(result.value.bins.at(-1)?.to).toBe(6);
    // 1, 2 | 3 | 4 | 5, 6 (the last bin includes the maximum).
    expect(result.value.bins.map((b) => b.count)).toEqual([2, 1, 1, 2]);
  });
});

describe("Cpl = (mean − LSL) / (3 s), NIST/SEMATECH e-Handbook of Statistical Methods §6.1.6", () => {
  // Hand example (our own figures): capacities 3 010, 3 030, 3 050, 3 070, 3 090 mAh, minimum capacity 2 950 mAh.
  // mean = 15 250 / 5 = 3 050 mAh; deviations −40, −20, 0, 20, 40; squares 1 600 + 400 + 0 + 400 + 1 600 = 4 000;
  // s = √(4 000 / 4) = √1 000 = 31.6228 mAh; Cpl = (3 050 − 2 950) / (3 × 31.6228) = 100 / 94.8683 = 1.05409.
  it("hand example: five capacities against a 2 950 mAh minimum → Cpl 1.0541", () => {
    const d = summariseValues([3010, 3030, 3050, 3070, 3090], { minimum: 2950, rated: 3050 });
    expect(d.mean).toBe(3050);
    expect(d.standardDeviation).toBeCloseTo(31.6228, 4);
    expect(d.capability?.cpl).toBeCloseTo(1.05409, 5);
    expect(d.capability?.countBelow).toBe(0);
    // Share at or above a rated 3 050 mAh: 3 050, 3 070, 3 090 → 3 of 5.
    expect(d.rated).toEqual({ rated: 3050, countAtOrAbove: 3, shareAtOrAbove: 0.6 });
  });

  // Recalled from memory, verify: the handbook's worked example has LSL = 8, mean 16, σ = 2, so
  // Cpl = (16 − 8) / (3 × 2) = 1.333. The values 14, 16, 18 have mean 16 and s = √(8 / 2) = 2.
  it("the handbook's example (recalled): LSL 8, mean 16, σ 2 → Cpl 1.333", () => {
    const d = summariseValues([14, 16, 18], { minimum: 8 });
    expect(d.standardDeviation).toBe(2);
    expect(d.capability?.cpl).toBeCloseTo(4 / 3, 12);
  });
});
