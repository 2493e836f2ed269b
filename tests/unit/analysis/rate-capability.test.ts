import { describe, expect, it } from "vitest";
import { computeRateCapability, type DischargeResult } from "@/lib/analysis/rate-capability";

// An invented 3 000 mAh cell with a 10 A maximum continuous discharge current: It = 3 A.
const rating = { ratedCapacityMah: 3000, maxContinuousDischargeCurrentA: 10 };

function result(currentA: number, capacityAh: number, meanVoltageV: number, extra: Partial<DischargeResult> = {}): DischargeResult {
  return { currentA, capacityAh, energyWh: capacityAh * meanVoltageV, meanVoltageV, ...extra };
}

function table(results: DischargeResult[]) {
  const computed = computeRateCapability({ results, rating });
  if (!computed.ok) throw new Error(computed.error.message);
  return computed.value;
}

describe("computeRateCapability", () => {
  it("gives each current in A and It, as % of the 0.2 It result and of the rated capacity, lowest current first", () => {
    const t = table([result(3.0, 2.94, 3.55), result(0.6, 3.06, 3.68), result(1.5, 3.0, 3.62)]);
    expect(t.itA).toBe(3);
    expect(t.rows.map((r) => r.multipleOfIt)).toEqual([0.2, 0.5, 1]);
    const [reference, half, one] = t.rows;
    expect(reference).toMatchObject({ isReference: true, capacityMAh: 3060, capacityPercentOfReference: 100, energyPercentOfReference: 100 });
    expect(reference?.capacityPercentOfRated).toBeCloseTo(102, 12);
    // 2.94 / 3.06 = 96.078 %; energy 2.94 × 3.55 / (3.06 × 3.68) = 10.437 / 11.2608 = 92.684 %.
    expect(one?.capacityPercentOfReference).toBeCloseTo(96.078, 3);
    expect(one?.energyPercentOfReference).toBeCloseTo(92.684, 3);
    expect(one?.capacityPercentOfRated).toBeCloseTo(98, 12);
    expect(half?.meanVoltageV).toBe(3.62);
    expect(t.reference).toBe(reference);
    expect(t.referenceNote).toBeNull();
  });

  it("averages a lot's results at the same current", () => {
    const t = table([result(0.6, 3.0, 3.7), result(0.603, 3.1, 3.66), result(3.0, 2.9, 3.5), result(2.98, 2.8, 3.52)]);
    expect(t.rows).toHaveLength(2);
    expect(t.rows[0]).toMatchObject({ count: 2 });
    expect(t.rows[0]?.capacityAh).toBeCloseTo(3.05, 12);
    expect(t.rows[0]?.meanVoltageV).toBeCloseTo(3.68, 12);
    expect(t.rows[1]?.capacityPercentOfReference).toBeCloseTo((2.85 / 3.05) * 100, 10);
  });

  it("says 'no 0.2 It result' and leaves the percentages of it empty when there is none", () => {
    const t = table([result(1.5, 3.0, 3.62), result(3.0, 2.94, 3.55)]);
    expect(t.reference).toBeNull();
    expect(t.referenceNote).toBe("no 0.2 It result");
    expect(t.rows.every((r) => r.capacityPercentOfReference === null && r.energyPercentOfReference === null)).toBe(true);
    expect(t.rows[0]?.capacityPercentOfRated).toBe(100);
  });

  it("marks results above the maximum continuous discharge current, or flagged beyond the rating on the run", () => {
    const t = table([result(0.6, 3.0, 3.68), result(10.05, 2.7, 3.4), result(15, 2.5, 3.3), result(6, 2.8, 3.45, { beyondRating: true })]);
    const byCurrent = new Map(t.rows.map((r) => [r.currentA, r]));
    expect(byCurrent.get(10.05)).toMatchObject({ aboveRating: false, aboveRatingReason: null });
    expect(byCurrent.get(15)?.aboveRating).toBe(true);
    expect(byCurrent.get(15)?.aboveRatingReason).toContain("above the maximum continuous discharge current of 10 A");
    expect(byCurrent.get(6)?.aboveRatingReason).toBe("1 of 1 result flagged on the run as beyond the cell's rating");
  });

  it("states its basis", () => {
    expect(table([result(0.6, 3.0, 3.68)]).basis[0]).toBe("It = rated capacity / 1 h = 3 A (IEC 61434).");
  });

  it.each([
    [{ results: [], rating }, "no discharge results"],
    [{ results: [result(0.6, 3, 3.7)], rating: { ratedCapacityMah: 0, maxContinuousDischargeCurrentA: 10 } }, "rated capacity"],
    [{ results: [result(0.6, -1, 3.7)], rating }, "0 or more"],
    [{ results: [result(0.6, 3, 0)], rating }, "mean voltage"],
    [{ results: [result(0, 3, 3.7)], rating }, "positive number of amperes"],
  ])("refuses bad input (%#)", (input, words) => {
    const computed = computeRateCapability(input);
    expect(computed.ok || computed.error.message).toContain(words);
  });
});
