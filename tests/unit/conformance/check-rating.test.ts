import { describe, expect, it } from "vitest";
import { checkCautionsAcknowledged, checkRating } from "@/lib/conformance";
import type { ResolutionCaution } from "@/protocols";
import { contextOf, rating, recordOf, steps } from "./context-fixtures";

const lowRate = { ...rating, maxContinuousDischargeCurrentA: 0.5 };

describe("checkRating", () => {
  it("meets for a current within the rating", () => {
    const [finding] = checkRating(contextOf({ step: steps.discharge, record: recordOf({ stepId: "discharge", programmed: { current: 0.6 } }) }));
    expect(finding).toMatchObject({ rule: "current-within-rating", outcome: "meets", severity: "caution", expected: { max: 15 } });
    expect(finding?.beyondRating).toBeUndefined();
  });

  it("deviates, as a caution beyond the rating, for a discharge above the maximum continuous current without acknowledgement", () => {
    const record = recordOf({ stepId: "discharge", programmed: { current: 0.6 } });
    const [finding] = checkRating(contextOf({ step: steps.discharge, record, cellRating: lowRate }));
    expect(finding).toMatchObject({ outcome: "deviates", severity: "caution", beyondRating: true, observed: { value: 0.6 } });
    expect(finding?.note).toBe("Acknowledge its caution before running outside the rating.");
  });

  it("meets but stays marked beyond the rating once the caution is acknowledged, on the record or on the version", () => {
    const code = "discharge-current-above-rating/discharge/current";
    const onRecord = recordOf({
      stepId: "discharge",
      programmed: { current: 0.6 },
      acknowledgedCautionCodes: [code],
      cautionsAcknowledged: { by: "Ola Operator", at: "2026-03-02T08:00:00Z" },
    });
    const byOperator = checkRating(contextOf({ step: steps.discharge, record: onRecord, cellRating: lowRate, acknowledged: [code] }))[0];
    expect(byOperator).toMatchObject({ outcome: "meets", beyondRating: true });
    // Never a bare "meets": the observation says who took the step outside the rating, and when.
    expect(byOperator?.observed.text).toBe("0.6 A programmed: outside the rating, acknowledged by Ola Operator at 2026-03-02T08:00:00Z");
    const onVersion = checkRating(
      contextOf({ step: steps.discharge, record: recordOf({ stepId: "discharge", programmed: { current: 0.6 } }), cellRating: lowRate, acknowledged: [code] }),
    )[0];
    expect(onVersion).toMatchObject({ outcome: "meets", beyondRating: true });
    expect(onVersion?.observed.text).toContain("outside the rating, acknowledged on the released procedure version");
  });

  it("falls back on the resolved current when none was recorded, and judges both pulse levels", () => {
    const [resolvedOnly] = checkRating(contextOf({ step: steps.discharge, record: null, cellRating: lowRate }));
    expect(resolvedOnly?.observed.text).toContain("as set in the procedure");
    expect(resolvedOnly?.outcome).toBe("deviates");
    const pulse = checkRating(contextOf({ step: steps.pulse, record: null, cellRating: { ...rating, maxContinuousDischargeCurrentA: 2 } }));
    expect(pulse.map((f) => [f.id, f.outcome])).toEqual([
      ["pulse#1/current-within-rating/baseCurrent", "meets"],
      ["pulse#1/current-within-rating/pulseCurrent", "deviates"],
    ]);
  });

  it("judges a charge against the maximum charge current, else the standard one, else cannot", () => {
    const charge = (cellRating: typeof rating) => checkRating(contextOf({ step: steps.charge, record: null, cellRating }))[0];
    expect(charge({ ...rating, maxChargeCurrentA: 1 })?.outcome).toBe("deviates");
    expect(charge({ maxContinuousDischargeCurrentA: 15, standardChargeCurrentA: 1.5, chargeVoltageV: 4.2 })).toMatchObject({ outcome: "meets", expected: { max: 1.5 } });
    expect(charge({ maxContinuousDischargeCurrentA: 15, chargeVoltageV: 4.2 })?.outcome).toBe("not assessable");
    expect(checkRating(contextOf({ step: steps.rest }))).toEqual([]);
  });
});

describe("checkCautionsAcknowledged", () => {
  const caution: ResolutionCaution = {
    severity: "caution",
    kind: "soak-below-zero-celsius",
    code: "soak-below-zero-celsius/soak/temperature",
    path: "steps.0.temperature",
    stepId: "soak",
    message: "the soak temperature reaches −22 °C",
    acknowledged: false,
  };

  it("deviates for an unacknowledged caution of the step and meets once acknowledged", () => {
    expect(checkCautionsAcknowledged(contextOf({ step: steps.soak }), [caution])[0]).toMatchObject({ outcome: "deviates", severity: "caution" });
    expect(checkCautionsAcknowledged(contextOf({ step: steps.soak, acknowledged: [caution.code] }), [caution])[0]?.outcome).toBe("meets");
  });

  it("ignores other steps' cautions and the current cautions checkRating judges", () => {
    expect(checkCautionsAcknowledged(contextOf({ step: steps.rest }), [caution])).toEqual([]);
    const current = { ...caution, kind: "discharge-current-above-rating" as const, stepId: "soak" };
    expect(checkCautionsAcknowledged(contextOf({ step: steps.soak }), [current])).toEqual([]);
  });
});
