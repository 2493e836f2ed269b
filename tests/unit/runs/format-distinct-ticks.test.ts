import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatDistinctTicks } from "@/components/runs/results/format-distinct-ticks";

describe("formatDistinctTicks", () => {
  it("writes close ticks with enough decimals to tell them apart, all alike", () => {
    expect(formatDistinctTicks([-0.97, -0.9705, -0.971], 0.0005)).toEqual(["−0.9700", "−0.9705", "−0.9710"]);
    expect(formatDistinctTicks([0, 0.5, 1, 1.5], 0.5)).toEqual(["0.0", "0.5", "1.0", "1.5"]);
    expect(formatDistinctTicks([0, 1000, 2000], 1000)).toEqual(["0", "1000", "2000"]);
  });

  it("never shows a negative zero", () => {
    expect(formatDistinctTicks([-1e-17, 0.1], 0.1)).toEqual(["0.0", "0.1"]);
  });

  it("gives distinct labels for any increasing ticks of a sensible increment", () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 1000, noNaN: true }), fc.integer({ min: -6, max: 3 }), fc.integer({ min: 2, max: 12 }), (start, exponent, count) => {
        const incr = 10 ** exponent;
        const splits = Array.from({ length: count }, (_, i) => start + i * incr);
        const labels = formatDistinctTicks(splits, incr);
        expect(new Set(labels).size).toBe(count);
      }),
    );
  });
});
