import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { accumulateCapacityAh, EVERY_SAMPLE_FACTOR, planSeriesRead, STRIDE_OVERSAMPLE, thinChannels } from "@/lib/runs/plan-series-read";

describe("planSeriesRead", () => {
  it("reads every sample of a short stretch", () => {
    expect(planSeriesRead({ from: 10, to: 10 + 2000 * EVERY_SAMPLE_FACTOR - 1, points: 2000 })).toEqual({ kind: "every-sample", from: 10, to: 10 + 2000 * EVERY_SAMPLE_FACTOR - 1 });
  });

  it("reads evenly spaced samples of a 2-million-sample log, first and last included", () => {
    const plan = planSeriesRead({ from: 0, to: 1_999_999, points: 2000 });
    expect(plan.kind).toBe("strided");
    if (plan.kind !== "strided") return;
    expect(plan.indexes).toHaveLength(2000 * STRIDE_OVERSAMPLE);
    expect(plan.indexes[0]).toBe(0);
    expect(plan.indexes.at(-1)).toBe(1_999_999);
  });

  it("gives strictly increasing indexes inside the range", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e6 }), fc.integer({ min: 1, max: 3e6 }), fc.integer({ min: 50, max: 3000 }), (from, count, points) => {
        const plan = planSeriesRead({ from, to: from + count - 1, points });
        if (plan.kind === "every-sample") return count <= points * EVERY_SAMPLE_FACTOR;
        return plan.indexes.every((k, i) => k >= from && k <= from + count - 1 && (i === 0 || k > (plan.indexes[i - 1] as number)));
      }),
    );
  });
});

describe("accumulateCapacityAh", () => {
  it("counts a 1 h discharge at -0.6 A as 0.6 Ah (Q = ∫|I| dt, definition)", () => {
    const t = Float64Array.from({ length: 361 }, (_, k) => k * 10);
    const i = new Float64Array(361).fill(-0.6);
    const q = accumulateCapacityAh(t, i);
    expect(q[0]).toBe(0);
    expect(q[360]).toBeCloseTo(0.6, 12);
  });
});

describe("thinChannels", () => {
  it("keeps the same samples of every channel, so lines share one x axis", () => {
    const n = 10_000;
    const x = Float64Array.from({ length: n }, (_, k) => k);
    const y = Float64Array.from({ length: n }, (_, k) => Math.sin(k / 100));
    const other = Float64Array.from({ length: n }, (_, k) => k * 2);
    const out = thinChannels(x, y, { other }, 200);
    expect(out.x).toHaveLength(200);
    expect(out.others.other).toEqual(out.x.map((v) => v * 2));
    expect(out.x[0]).toBe(0);
    expect(out.x.at(-1)).toBe(n - 1);
  });
});
