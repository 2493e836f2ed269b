import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { computeSturgesBinCount, histogram } from "@/lib/statistics";

describe("histogram", () => {
  it("chooses the number of bins by Sturges' rule and says so", () => {
    expect([1, 2, 8, 9, 16, 100].map(computeSturgesBinCount)).toEqual([1, 2, 4, 5, 5, 8]);
    const result = histogram({ values: Array.from({ length: 9 }, (_, k) => 3000 + 10 * k) });
    expect(result.ok && result.value.bins).toHaveLength(5);
    expect(result.ok && result.value.rule).toBe("Sturges' rule: k = ⌈log₂ 9⌉ + 1 = 5 bins of equal width");
  });

  it("puts every result in the bin whose edges hold it, the maximum in the last bin", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 1000, max: 4000, noNaN: true }), { minLength: 1, maxLength: 200 }),
        fc.option(fc.integer({ min: 1, max: 30 }), { nil: undefined }),
        (values, binCount) => {
          const result = histogram({ values, binCount });
          if (!result.ok) return false;
          const { bins } = result.value;
          expect(bins.reduce((sum, b) => sum + b.count, 0)).toBe(values.length);
          for (let k = 1; k < bins.length; k++) expect(bins[k]?.from).toBe(bins[k - 1]?.to);
          expect(bins[0]?.from).toBe(Math.min(...values));
          expect(bins.at(-1)?.to).toBe(Math.max(...values));
          return true;
        },
      ),
      { seed: 1926, numRuns: 500 },
    );
  });

  it("gives one bin when every result is the same", () => {
    const result = histogram({ values: [3050, 3050, 3050] });
    expect(result.ok && result.value).toEqual({ bins: [{ from: 3050, to: 3050, count: 3 }], rule: "one bin: every result is the same" });
  });

  it.each([
    [{ values: [] }, "at least one result"],
    [{ values: [1, Number.POSITIVE_INFINITY] }, "finite"],
    [{ values: [1, 2], binCount: 0 }, "from 1 to 100"],
    [{ values: [1, 2], binCount: 2.5 }, "from 1 to 100"],
  ])("refuses %o", (input, words) => {
    const result = histogram(input);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error.message).toContain(words);
  });
});
