import { describe, expect, it } from "vitest";
import { compareWithDatasheet, type DatasheetClaims, type DatasheetMeasurements } from "@/lib/analysis/datasheet-comparison";

// An invented cell type: 3 000 mAh rated, 2 950 mAh minimum, 3.6 V nominal, 48.0 g maximum, 10 A maximum.
const claims: DatasheetClaims = { ratedCapacityMah: 3000, minimumCapacityMah: 2950, nominalVoltageV: 3.6, maxMassG: 48, maxContinuousDischargeCurrentA: 10 };
const measured: DatasheetMeasurements = {
  capacityMah: [3040, 3061, 3080],
  energyWh: [11.0, 11.1, 11.2],
  massG: [46.8, 47.1, 47.0],
  dischargeCurrentsA: [0.6, 0.6, 3, 10.02],
};

function compare(c: DatasheetClaims = claims, m: DatasheetMeasurements = measured) {
  const result = compareWithDatasheet({ claims: c, measured: m });
  if (!result.ok) throw new Error(result.error.message);
  return new Map(result.value.lines.map((line) => [line.key, line]));
}

describe("compareWithDatasheet", () => {
  it("puts each claim beside the measured distribution with a verdict in words", () => {
    const lines = compare();
    expect([...lines.keys()]).toEqual(["ratedCapacity", "minimumCapacity", "nominalEnergy", "maxMass", "maxContinuousDischargeCurrent"]);
    expect(lines.get("ratedCapacity")).toMatchObject({ verdict: "meets the claim", basis: "All 3 results at least 3 000 mAh." });
    expect(lines.get("ratedCapacity")?.claimed.text).toBe("3 000 mAh");
    expect(lines.get("ratedCapacity")?.measured?.text).toBe("3 results: mean 3 060 mAh, s 20 mAh, 3 040 mAh to 3 080 mAh");
    expect(lines.get("maxMass")).toMatchObject({ verdict: "meets the claim", basis: "All 3 results at most 48.0 g." });
    expect(lines.get("maxContinuousDischargeCurrent")?.verdict).toBe("meets the claim");
    expect(lines.get("maxContinuousDischargeCurrent")?.basis).toContain("1 discharge completed at 10.00 A (within 2 %)");
  });

  it("derives the energy claim from rated capacity × nominal voltage when the datasheet gives none, and says so", () => {
    const energy = compare().get("nominalEnergy");
    expect(energy).toMatchObject({ claimOrigin: "derived", verdict: "meets the claim" });
    expect(energy?.claimed.value).toBeCloseTo(10.8, 12);
    expect(energy?.claimNote).toBe("The datasheet states no energy: rated capacity × nominal voltage = 3 000 mAh × 3.60 V = 10.80 Wh.");
    const stated = compare({ ...claims, nominalEnergyWh: 11.15 }).get("nominalEnergy");
    expect(stated).toMatchObject({ claimOrigin: "datasheet", claimNote: null, verdict: "below the claim" });
    expect(stated?.basis).toBe("2 of 3 results below 11.15 Wh; the claim holds for every cell.");
  });

  it("says 'below the claim' for capacity under the rating and 'above the claim' for a heavy cell", () => {
    const lines = compare(claims, { ...measured, capacityMah: [2990, 3010, 2940], massG: [47.5, 48.3] });
    expect(lines.get("ratedCapacity")).toMatchObject({ verdict: "below the claim", basis: "2 of 3 results below 3 000 mAh; the claim holds for every cell." });
    expect(lines.get("minimumCapacity")?.verdict).toBe("below the claim");
    expect(lines.get("maxMass")).toMatchObject({ verdict: "above the claim", basis: "1 of 2 results above 48.0 g; the claim holds for every cell." });
  });

  it("says 'not measured' when nothing answers a claim, and leaves out claims the datasheet does not make", () => {
    const lines = compare(
      { ratedCapacityMah: 3000, nominalVoltageV: 3.6, maxContinuousDischargeCurrentA: 10 },
      { capacityMah: [], energyWh: [3.0], massG: [], dischargeCurrentsA: [0.6, 3] },
    );
    expect([...lines.keys()]).toEqual(["ratedCapacity", "nominalEnergy", "maxContinuousDischargeCurrent"]);
    expect(lines.get("ratedCapacity")).toMatchObject({ verdict: "not measured", measured: null });
    expect(lines.get("nominalEnergy")?.measured?.text).toBe("1 result: 3.00 Wh");
    expect(lines.get("maxContinuousDischargeCurrent")).toMatchObject({
      verdict: "not measured",
      basis: "No discharge at 10.00 A (within 2 %); highest current discharged: 3.00 A.",
    });
  });

  it("does not count discharges above the claimed current as answering it", () => {
    const line = compare(claims, { ...measured, dischargeCurrentsA: [0.6, 15] }).get("maxContinuousDischargeCurrent");
    expect(line).toMatchObject({ verdict: "not measured", measured: null });
    expect(line?.basis).toBe(
      "No discharge at 10.00 A (within 2 %); highest current discharged: 15.00 A; discharges above the claim are outside the rating and do not answer it.",
    );
  });

  it("states the decision rule", () => {
    const result = compareWithDatasheet({ claims, measured });
    expect(result.ok && result.value.decisionRule).toContain("simple acceptance, without a guard band");
  });

  it.each([
    [{ ...claims, ratedCapacityMah: 0 }, measured, "datasheet value"],
    [claims, { ...measured, massG: [Number.NaN] }, "measured value"],
  ])("refuses bad input (%#)", (c, m, words) => {
    const result = compareWithDatasheet({ claims: c, measured: m });
    expect(result.ok || result.error.message).toContain(words);
  });
});
