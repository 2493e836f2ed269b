import { describe, expect, it } from "vitest";
import { describeDischargeEnd, evaluateCapacityUncertainty, extendCapacityBudget, findResolution } from "@/lib/analysis";

// Issue 12, 2: the capacity budget's further terms, each checked against a hand calculation from JCGM 100:2008
// [published]: rectangular a → a/√3 (4.3.7), resolution δ → half-width δ/2 (F.2.2.1), experimental standard
// deviation s(q_k) with n − 1 (4.2.2), sensitivity coefficients (5.1.3), combination in quadrature (5.1.2, 5.1.6),
// k = 2 (6.2.1). Base budget: docs/references.md §6 Example A (I = 0.600 A, t = 5.10 h, Q = 3.060 Ah, clause-4 limits
// ±1 % current, ±0.1 % time; IEC 61960-3 clause 4 as recalled, published via IEC 61951-2:2022 clause 4).
function exampleA() {
  const made = evaluateCapacityUncertainty({
    capacityAh: 3.06,
    currentA: 0.6,
    durationS: 5.1 * 3600,
    sources: [
      { quantity: "current", source: "clause 4 current", tolerance: { form: "percent-of-reading", percent: 1 } },
      { quantity: "time", source: "clause 4 time", tolerance: { form: "percent-of-reading", percent: 0.1 } },
    ],
  });
  if (!made.ok) throw new Error(made.error.message);
  return made.value;
}

describe("capacity budget terms (JCGM 100:2008; issue 12, 2)", () => {
  it("Example A alone: U = 1.1605 % (docs/references.md §6) [published arithmetic]", () => {
    expect(exampleA().relativeExpandedUncertainty * 100).toBeCloseTo(1.1605, 4);
  });

  it("end voltage: ±1 % of 2.75 V through |dQ/dV| = 0.5 Ah/V adds u_r = 0.2594 % → U = 1.2712 % (hand calculation)", () => {
    // a = 0.0275 V; u(V) = 0.0275/√3 = 0.015877 V; u(Q) = 0.5 × 0.015877 = 0.0079386 Ah; u_r = 0.0079386/3.060 = 0.25943 %.
    // u_r(Q) = √(0.333333 + 0.003333 + 0.067304) % = √0.403970 % = 0.63559 %; U = 1.27117 %.
    const budget = extendCapacityBudget(exampleA(), {
      endVoltage: { source: "clause 4 voltage", tolerance: { form: "percent-of-reading", percent: 1 }, endVoltageV: 2.75, slopeAhPerV: 0.5 },
    });
    const row = budget.rows[2]!;
    expect(row.quantity).toBe("end voltage");
    expect(row.standardUncertainty).toBeCloseTo(0.015877, 6);
    expect(row.sensitivity).toBeCloseTo((0.5 * 2.75) / 3.06, 12);
    expect(row.relativeContribution * 100).toBeCloseTo(0.25943, 4);
    expect(budget.relativeCombinedStandardUncertainty * 100).toBeCloseTo(0.63559, 4);
    expect(budget.relativeExpandedUncertainty * 100).toBeCloseTo(1.27117, 4);
  });

  it("log resolution: current to 1 mA at 0.6 A gives u_r = 0.04811 %; time to 1 s over 5.1 h gives 0.00314 % (hand calculation)", () => {
    // current: a = 0.0005 A, u = 0.00028868 A, u_r = 0.048113 %; time: a = 1 s (½ s at each end), u = 0.57735 s, u_r = 0.0031446 %.
    const budget = extendCapacityBudget(exampleA(), { currentResolutionA: { value: 0.001, currentA: 0.6 }, timeResolutionS: { value: 1, durationS: 18_360 } });
    expect(budget.rows[2]!.relativeContribution * 100).toBeCloseTo(0.048113, 5);
    expect(budget.rows[3]!.relativeContribution * 100).toBeCloseTo(0.0031446, 6);
    expect(budget.relativeCombinedStandardUncertainty * 100).toBeCloseTo(Math.hypot(0.57735, 0.057735, 0.048113, 0.0031446), 4);
  });

  it("Type A from three cycles 3.00, 3.02, 3.04 Ah: s = 0.0200 Ah, u_r = 0.6536 % of 3.060 Ah (GUM 4.2.2, hand calculation)", () => {
    const budget = extendCapacityBudget(exampleA(), { repeatedCycles: { capacitiesAh: [3.0, 3.02, 3.04] } });
    const row = budget.rows[2]!;
    expect(row.standardUncertainty).toBeCloseTo(0.02, 12);
    expect(row.divisor).toBe(1);
    expect(row.relativeContribution * 100).toBeCloseTo(0.65359, 4);
    // One cycle is not a repetition: no Type A line.
    expect(extendCapacityBudget(exampleA(), { repeatedCycles: { capacitiesAh: [3.0] } }).rows).toHaveLength(2);
  });
});

describe("reading the end of a logged discharge", () => {
  it("|dQ/dV| of a 0.6 A discharge falling 1 mV/s at the end is 0.6/3600/0.001 = 0.16667 Ah/V (definition)", () => {
    const n = 600;
    const timeS = Float64Array.from({ length: n }, (_, k) => k);
    const voltageV = Float64Array.from({ length: n }, (_, k) => 3.35 - 0.001 * k);
    const currentA = Float64Array.from({ length: n }, () => -0.6);
    const detail = describeDischargeEnd({ timeS, voltageV, currentA, length: n }, { from: 0, to: n - 1 });
    expect(detail.endSlopeAhPerV).toBeCloseTo(0.6 / 3600 / 0.001, 9);
    expect(detail.endVoltageV).toBeCloseTo(2.751, 12);
    expect(detail.timeResolutionS).toBe(1);
    expect(detail.currentResolutionA).toBe(0.1);
  });

  it("finds a column's resolution from its written decimals, and none for full-precision values", () => {
    expect(findResolution([0.6003, 0.6, 0.59], { from: 0, to: 2 })).toBe(0.0001);
    expect(String(findResolution([0.6003], { from: 0, to: 0 }))).toBe("0.0001");
    expect(findResolution([0.1 + 0.2, 0.6], { from: 0, to: 1 })).toBeCloseTo(0.1, 15);
    expect(findResolution([Math.PI, Math.E], { from: 0, to: 1 })).toBeNull();
  });
});
