import { describe, expect, it } from "vitest";
import { describeResults } from "@/lib/statistics";

describe("describeResults", () => {
  it.each([
    [[], "none"],
    [[3050], "only one"],
  ])("refuses statistics over fewer than two results (%j)", (values, words) => {
    const result = describeResults({ values, unit: "mAh" });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.code).toBe("invalid-input");
    expect(result.error.message).toBe(`Statistics need at least two results; this group has ${words}.`);
  });

  it("refuses a result that is not a finite number", () => {
    const result = describeResults({ values: [3050, Number.NaN], unit: "mAh" });
    expect(result.ok || result.error.message).toBe("Every result must be a finite number.");
  });

  it("counts a result equal to the rated value as at or above it", () => {
    const result = describeResults({ values: [2990, 3000, 3010, 3020], unit: "mAh", rated: 3000 });
    expect(result.ok && result.value.rated).toEqual({ rated: 3000, countAtOrAbove: 3, shareAtOrAbove: 0.75 });
  });

  it("leaves out the rated share and Cpl when no rated value or minimum is given", () => {
    const result = describeResults({ values: [1, 2], unit: "Wh" });
    expect(result.ok && result.value).toMatchObject({ count: 2, unit: "Wh", rated: null, capability: null });
  });

  it("gives Cpl below 0 when the mean lies under the minimum, and counts the results below it", () => {
    const result = describeResults({ values: [2900, 2940, 2980], unit: "mAh", minimum: 2950 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.capability?.countBelow).toBe(2);
    // mean 2 940, s 40 → (2 940 − 2 950) / 120 = −0.0833.
    expect(result.value.capability?.cpl).toBeCloseTo(-1 / 12, 12);
    expect(result.value.capability?.source).toContain("NIST/SEMATECH");
  });

  it("says Cpl is not defined when every result is the same", () => {
    const result = describeResults({ values: [3000, 3000, 3000], unit: "mAh", minimum: 2900 });
    expect(result.ok && result.value.capability).toMatchObject({ cpl: null, note: "Cpl is not defined: every result is the same, so s = 0." });
  });
});
