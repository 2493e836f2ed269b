import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaluateDcResistanceUncertainty } from "@/lib/analysis/dc-resistance-uncertainty";
import { computeDivisor, describeTolerance, evaluateCapacityUncertainty, type UncertaintySource } from "@/lib/analysis/uncertainty";

const current: UncertaintySource = { quantity: "current", source: "current channel", tolerance: { form: "percent-of-reading", percent: 0.1 } };

describe("uncertainty budgets", () => {
  it("divides a normal limit by its coverage factor and writes tolerances in plain words", () => {
    expect(computeDivisor({ kind: "normal", coverageFactor: 2 })).toBe(2);
    expect(describeTolerance({ form: "percent-of-reading-and-range", percentOfReading: 0.05, percentOfRange: 0.02, range: 10 }, "A")).toBe(
      "±(0.05 % of reading + 0.02 % of 10 A range)",
    );
    expect(describeTolerance({ form: "absolute", halfWidth: 0.5 }, "s")).toBe("±0.5 s");
  });

  it("takes an absolute time limit relative to the duration, and a calibration U with its k", () => {
    const result = evaluateCapacityUncertainty({
      capacityAh: 2,
      currentA: 1,
      durationS: 7200,
      sources: [
        { quantity: "time", source: "clock", tolerance: { form: "absolute", halfWidth: 7.2 } },
        { ...current, distribution: { kind: "normal", coverageFactor: 2 } },
      ],
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.rows[0]!.relativeStandardUncertainty).toBeCloseTo(0.001 / Math.sqrt(3), 15);
    expect(result.value.rows[1]!.relativeStandardUncertainty).toBeCloseTo(0.0005, 15);
    expect(result.value.rows[1]!.divisor).toBe(2);
    expect(result.value.expandedUncertainty).toBeCloseTo(2 * 2 * Math.hypot(0.001 / Math.sqrt(3), 0.0005), 15);
  });

  it("combines sources in quadrature: adding one never lowers the result, and order does not matter", () => {
    const sourceArb = fc.record({
      quantity: fc.constantFrom<"current" | "time">("current", "time"),
      percent: fc.double({ min: 0, max: 5, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(sourceArb, { minLength: 1, maxLength: 6 }), (drawn) => {
        const sources = drawn.map((s): UncertaintySource => ({ quantity: s.quantity, source: "x", tolerance: { form: "percent-of-reading", percent: s.percent } }));
        const evaluate = (list: UncertaintySource[]) => evaluateCapacityUncertainty({ capacityAh: 3, currentA: 0.6, durationS: 18_000, sources: list });
        const all = evaluate(sources);
        const fewer = evaluate(sources.slice(1));
        const reversed = evaluate([...sources].reverse());
        if (!all.ok || !fewer.ok || !reversed.ok) return false;
        const u = all.value.relativeCombinedStandardUncertainty;
        return u >= fewer.value.relativeCombinedStandardUncertainty - 1e-15 && Math.abs(u - reversed.value.relativeCombinedStandardUncertainty) < 1e-15;
      }),
    );
  });

  it("returns typed errors for a quantity that does not enter, a zero result and negative limits", () => {
    const voltage: UncertaintySource = { quantity: "voltage", source: "voltage channel", tolerance: { form: "percent-of-reading", percent: 1 } };
    const notInQ = evaluateCapacityUncertainty({ capacityAh: 3, currentA: 0.6, durationS: 18_000, sources: [voltage] });
    expect(notInQ.ok || notInQ.error.message).toContain("voltage does not enter the capacity");
    const zero = evaluateCapacityUncertainty({ capacityAh: 0, currentA: 0.6, durationS: 18_000, sources: [current] });
    expect(zero.ok || zero.error.code).toBe("invalid-input");
    const negative = evaluateCapacityUncertainty({
      capacityAh: 3,
      currentA: 0.6,
      durationS: 18_000,
      sources: [{ ...current, tolerance: { form: "percent-of-reading", percent: -1 } }],
    });
    expect(negative.ok || negative.error.code).toBe("invalid-input");
  });
});

describe("DC resistance uncertainty", () => {
  const readings = { u1V: 3.9, i1A: -0.6, u2V: 3.852, i2A: -3.0 };

  it("keeps range and resolution terms per reading in the same-channel model", () => {
    const result = evaluateDcResistanceUncertainty({
      readings,
      voltage: { percentOfReading: 0.02, percentOfRange: 0.01, range: 5, resolution: 0.0001 },
      current: { percentOfReading: 0.05 },
      correlation: "same-channel",
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.rows.map((r) => r.quantity)).toEqual(["U1 − U2", "U1", "U2", "U1", "U2", "I1 − I2"]);
    // Range term ±0.5 mV per reading, independent: u(U1 − U2) from it = √2 · 0.5 mV/√3 on a 48 mV step.
    const rangeShare = Math.hypot(result.value.rows[1]!.relativeContribution, result.value.rows[2]!.relativeContribution);
    expect(rangeShare).toBeCloseTo((Math.SQRT2 * 0.0005) / Math.sqrt(3) / 0.048, 12);
    // Resolution 0.1 mV enters as ±0.05 mV.
    expect(result.value.rows[3]!.halfWidth).toBeCloseTo(0.00005, 15);
  });

  it("is never smaller for independent readings than for one channel's correlated gain", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 2, noNaN: true }), fc.double({ min: 0.001, max: 2, noNaN: true }), (pv, pi) => {
        const evaluate = (correlation: "same-channel" | "independent") =>
          evaluateDcResistanceUncertainty({ readings, voltage: { percentOfReading: pv }, current: { percentOfReading: pi }, correlation });
        const same = evaluate("same-channel");
        const independent = evaluate("independent");
        if (!same.ok || !independent.ok) return false;
        return independent.value.relativeCombinedStandardUncertainty >= same.value.relativeCombinedStandardUncertainty;
      }),
    );
  });

  it("refuses a pulse without a step, and a range term without its range", () => {
    const flat = evaluateDcResistanceUncertainty({ readings: { ...readings, u2V: 3.9 }, voltage: { percentOfReading: 1 }, current: { percentOfReading: 1 }, correlation: "same-channel" });
    expect(flat.ok || flat.error.code).toBe("invalid-input");
    const noRange = evaluateDcResistanceUncertainty({ readings, voltage: { percentOfReading: 1, percentOfRange: 0.1 }, current: { percentOfReading: 1 }, correlation: "same-channel" });
    expect(noRange.ok || noRange.error.message).toContain("needs the range");
  });
});
