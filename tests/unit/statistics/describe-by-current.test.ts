import { describe, expect, it } from "vitest";
import { describeByCurrent } from "@/lib/statistics";

// A 3 000 mAh cell: It = 3 A, 0.2 It = 0.6 A (docs/references.md §1).
const rated = 3000;

describe("describeByCurrent", () => {
  it("describes capacity (mAh) and energy (Wh) at each current, marking the 0.2 It group", () => {
    const results = [
      { currentA: 0.6, capacityAh: 3.05, energyWh: 11.1 },
      { currentA: 0.601, capacityAh: 3.07, energyWh: 11.2 },
      { currentA: 0.599, capacityAh: 2.99, energyWh: 10.9 },
      { currentA: 3.0, capacityAh: 2.9, energyWh: 10.2 },
    ];
    const described = describeByCurrent({ results, ratedCapacityMah: rated, minimumCapacityMah: 2950, ratedEnergyWh: 10.8 });
    expect(described.ok).toBe(true);
    if (!described.ok) return;
    const [reference, oneIt] = described.value;
    expect(reference).toMatchObject({ count: 3, isReferenceCurrent: true, note: null });
    expect(reference?.capacity.ok && reference.capacity.value).toMatchObject({ count: 3, unit: "mAh", min: 2990, max: 3070 });
    expect(reference?.capacity.ok && reference.capacity.value.rated?.countAtOrAbove).toBe(2);
    expect(reference?.energy.ok && reference.energy.value.rated?.countAtOrAbove).toBe(3);
    // One result at 1 It: statistics refused with the message, not a crash.
    expect(oneIt).toMatchObject({ count: 1, isReferenceCurrent: false });
    const capacityAtOneIt = oneIt?.capacity;
    expect(capacityAtOneIt?.ok === false && capacityAtOneIt.error.message).toBe("Statistics need at least two results; this group has only one.");
    expect(oneIt?.note).toContain("defined at 0.2 It");
  });

  it("refuses an empty set of results", () => {
    const described = describeByCurrent({ results: [], ratedCapacityMah: rated });
    expect(described.ok || described.error.message).toBe("There are no discharge results to describe.");
  });
});
