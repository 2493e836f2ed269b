import { describe, expect, it } from "vitest";
import { checkChargeVoltage } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, steps, valueOf } from "./context-fixtures";

function chargeUpTo(peakV: number) {
  return logOf([...levelOf(100, (k) => 3.7 + ((peakV - 3.7) * k) / 99, 1.5), ...levelOf(100, 4.19, (k) => 1.5 * Math.exp(-k / 30))]);
}

describe("checkChargeVoltage", () => {
  it("meets while the logged voltage stays at or below the cell's charge voltage, with the reading allowance", () => {
    const [finding] = checkChargeVoltage(contextOf({ step: steps.charge, evidence: evidenceOf(chargeUpTo(4.203)) }));
    expect(finding).toMatchObject({ rule: "charge-voltage-within-limit", outcome: "meets", severity: "caution", expected: { value: 4.2, max: 4.205 } });
    expect(finding?.beyondRating).toBeUndefined();
  });

  it("a peak of 4.24 V on a 4.2 V cell deviates and is a safety finding: it met the old +1 % limit (4.242 V) (issue 12, 3c)", () => {
    const [finding] = checkChargeVoltage(contextOf({ step: steps.charge, evidence: evidenceOf(chargeUpTo(4.24)) }));
    expect(finding).toMatchObject({ outcome: "deviates", beyondRating: true, severity: "caution", observed: { value: 4.24 } });
    expect(finding?.observed.text).toContain("40 mV above the cell's rated charge voltage: a safety finding");
    // A lab that sets no reading allowance judges against the rating itself.
    const strict = checkChargeVoltage(contextOf({ step: steps.charge, evidence: evidenceOf(chargeUpTo(4.203)), options: { chargeVoltageReadingAllowanceV: 0 } }))[0];
    expect(strict).toMatchObject({ outcome: "deviates", beyondRating: true });
  });

  it("holds a lower step voltage as the limit, but not a higher one", () => {
    const partial = { ...steps.charge, voltage: valueOf(4.1, "V") };
    const lower = checkChargeVoltage(contextOf({ step: partial, evidence: evidenceOf(chargeUpTo(4.19)) }))[0];
    expect(lower).toMatchObject({ outcome: "deviates", expected: { value: 4.1 } });
    // Above the step's voltage but within the cell's rating: a deviation from the procedure, not beyond the rating.
    expect(lower?.beyondRating).toBeUndefined();
    const above = { ...steps.charge, voltage: valueOf(4.35, "V") };
    expect(checkChargeVoltage(contextOf({ step: above, evidence: evidenceOf(chargeUpTo(4.19)) }))[0]).toMatchObject({ expected: { value: 4.2 } });
  });

  it("only judges charges, and needs the log", () => {
    expect(checkChargeVoltage(contextOf({ step: steps.discharge }))).toEqual([]);
    expect(checkChargeVoltage(contextOf({ step: steps.charge }))[0]?.outcome).toBe("not assessable");
  });
});
