import { describe, expect, it } from "vitest";
import { checkChargeVoltage } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, steps, valueOf } from "./context-fixtures";

function chargeUpTo(peakV: number) {
  return logOf([...levelOf(100, (k) => 3.7 + ((peakV - 3.7) * k) / 99, 1.5), ...levelOf(100, 4.19, (k) => 1.5 * Math.exp(-k / 30))]);
}

describe("checkChargeVoltage", () => {
  it("meets while the logged voltage stays at or below the charge voltage plus 1 %", () => {
    const [finding] = checkChargeVoltage(contextOf({ step: steps.charge, evidence: evidenceOf(chargeUpTo(4.24)) }));
    expect(finding).toMatchObject({ rule: "charge-voltage-within-limit", outcome: "meets", severity: "caution", expected: { max: 4.242 } });
    expect(finding?.beyondRating).toBeUndefined();
  });

  it("deviates above it, and marks a rise above the cell's own charge voltage as beyond the rating", () => {
    const [finding] = checkChargeVoltage(contextOf({ step: steps.charge, evidence: evidenceOf(chargeUpTo(4.3)) }));
    expect(finding).toMatchObject({ outcome: "deviates", beyondRating: true, observed: { value: 4.3 } });
  });

  it("holds a lower step voltage as the limit, but not a higher one", () => {
    const partial = { ...steps.charge, voltage: valueOf(4.1, "V") };
    expect(checkChargeVoltage(contextOf({ step: partial, evidence: evidenceOf(chargeUpTo(4.19)) }))[0]).toMatchObject({
      outcome: "deviates",
      expected: { value: 4.1 },
    });
    const above = { ...steps.charge, voltage: valueOf(4.35, "V") };
    expect(checkChargeVoltage(contextOf({ step: above, evidence: evidenceOf(chargeUpTo(4.19)) }))[0]).toMatchObject({ expected: { value: 4.2 } });
  });

  it("only judges charges, and needs the log", () => {
    expect(checkChargeVoltage(contextOf({ step: steps.discharge }))).toEqual([]);
    expect(checkChargeVoltage(contextOf({ step: steps.charge }))[0]?.outcome).toBe("not assessable");
  });
});
