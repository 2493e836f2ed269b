import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { downsampleLttb, downsampleMinMax, type Series } from "@/lib/analysis/downsample";

const arbitrarySeries = fc
  .array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 500 })
  .map((ys): Series => ({ x: Float64Array.from(ys, (_, k) => k * 0.5), y: Float64Array.from(ys) }));

describe("downsampleLttb", () => {
  it("keeps the first and last points, returns min(target, length) points in order", () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.integer({ min: 2, max: 600 }), (series, target) => {
        const result = downsampleLttb(series, target);
        if (!result.ok) return false;
        const { x, y, indexes } = result.value;
        const n = series.x.length;
        const increasing = indexes.every((index, k) => k === 0 || index > (indexes[k - 1] as number));
        const consistent = Array.from(indexes).every((index, k) => x[k] === series.x[index] && y[k] === series.y[index]);
        return (
          x.length === Math.min(target, n) && indexes[0] === 0 && indexes[indexes.length - 1] === n - 1 && increasing && consistent
        );
      }),
    );
  });

  it("returns the input arrays themselves when the target is at or above the length", () => {
    const series = { x: Float64Array.of(0, 1, 2), y: Float64Array.of(5, 6, 7) };
    const result = downsampleLttb(series, 3);
    expect(result.ok && result.value.x).toBe(series.x);
    expect(result.ok && Array.from(result.value.indexes)).toEqual([0, 1, 2]);
  });

  it("keeps a lone spike, the point that makes the largest triangle", () => {
    const y = new Float64Array(1000).fill(1);
    y[537] = 50;
    const result = downsampleLttb({ x: Float64Array.from(y, (_, k) => k), y }, 20);
    expect(result.ok && Array.from(result.value.indexes)).toContain(537);
  });

  it("refuses fewer than two points and mismatched arrays", () => {
    const series = { x: Float64Array.of(0, 1, 2), y: Float64Array.of(1, 2, 3) };
    const tooFew = downsampleLttb(series, 1);
    expect(tooFew.ok || tooFew.error.code).toBe("invalid-input");
    const mismatched = downsampleLttb({ x: series.x, y: Float64Array.of(1) }, 2);
    expect(mismatched.ok || mismatched.error.code).toBe("invalid-input");
  });
});

describe("downsampleMinMax", () => {
  it("keeps the endpoints, the overall lowest and highest points, and no more than the target", () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.integer({ min: 2, max: 600 }), (series, target) => {
        const result = downsampleMinMax(series, target);
        if (!result.ok) return false;
        const { y, indexes } = result.value;
        const n = series.y.length;
        const increasing = indexes.every((index, k) => k === 0 || index > (indexes[k - 1] as number));
        const keepsExtremes = target < 4 || (y.includes(Math.min(...series.y)) && y.includes(Math.max(...series.y)));
        return y.length <= Math.min(target, n) && indexes[0] === 0 && indexes[indexes.length - 1] === n - 1 && increasing && keepsExtremes;
      }),
    );
  });
});
