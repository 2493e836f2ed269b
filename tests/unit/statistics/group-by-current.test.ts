import { describe, expect, it } from "vitest";
import { findReferenceGroup, groupByCurrent } from "@/lib/statistics";

// A 3 000 mAh cell: It = 3 A, 0.2 It = 0.6 A (docs/references.md §1).
const rated = 3000;

describe("groupByCurrent", () => {
  it("joins currents within 2 % of the group's lowest and gives each group as a multiple of It", () => {
    const results = [0.6, 0.598, 0.605, 3.0, 2.99, 1.5, 0.62].map((currentA) => ({ currentA }));
    const grouped = groupByCurrent({ results, ratedCapacityMah: rated });
    expect(grouped.ok).toBe(true);
    if (!grouped.ok) return;
    // 0.598, 0.6, 0.605 (within 2 % of 0.598); 0.62 is 3.7 % above 0.598, a group of its own.
    expect(grouped.value.map((g) => g.members.length)).toEqual([3, 1, 1, 2]);
    expect(grouped.value[0]?.currentA).toBeCloseTo((0.598 + 0.6 + 0.605) / 3, 12);
    // (0.598 + 0.6 + 0.605) / 3 = 0.601 A; 0.601 A / 3 A = 0.20033 It.
    expect(grouped.value[0]?.multipleOfIt).toBeCloseTo(0.20033, 5);
    expect(grouped.value.map((g) => Math.round(g.multipleOfIt * 100) / 100)).toEqual([0.2, 0.21, 0.5, 1]);
  });

  it("finds the 0.2 It group within the tolerance, and none when no group is near", () => {
    const grouped = groupByCurrent({ results: [{ currentA: 0.605 }, { currentA: 1.5 }], ratedCapacityMah: rated });
    if (!grouped.ok) throw new Error(grouped.error.message);
    expect(findReferenceGroup(grouped.value, rated)?.currentA).toBe(0.605);
    expect(findReferenceGroup(grouped.value.slice(1), rated)).toBeNull();
    const far = groupByCurrent({ results: [{ currentA: 0.62 }], ratedCapacityMah: rated });
    expect(far.ok && findReferenceGroup(far.value, rated)).toBeNull();
  });

  it.each([
    [{ results: [{ currentA: -0.6 }], ratedCapacityMah: rated }, "positive number of amperes"],
    [{ results: [{ currentA: 0.6 }], ratedCapacityMah: 0 }, "rated capacity"],
    [{ results: [{ currentA: 0.6 }], ratedCapacityMah: rated, relativeTolerance: 0.7 }, "tolerance"],
  ])("refuses bad input (%#)", (input, words) => {
    const result = groupByCurrent(input);
    expect(result.ok || result.error.message).toContain(words);
  });
});
