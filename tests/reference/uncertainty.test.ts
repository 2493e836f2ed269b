import { describe, expect, it } from "vitest";
import type { StepResults } from "@/lib/analysis";
import { evaluateDcResistanceUncertainty } from "@/lib/analysis/dc-resistance-uncertainty";
import {
  computeHalfWidth,
  computeStandardUncertainty,
  evaluateCapacityUncertainty,
  evaluateEnergyUncertainty,
  type UncertaintySource,
} from "@/lib/analysis/uncertainty";
import { evaluateStepUncertainties, type RunInstrument } from "@/lib/conformance";

/** Percent values given to a number of decimals in docs/references.md are checked to half a unit of the last digit. */
function expectPercent(fraction: number, percent: number, decimals: number) {
  expect(Math.abs(fraction * 100 - percent)).toBeLessThanOrEqual(0.5 * 10 ** -decimals);
}

// Source: IEC 61960-3 clause 4 limits via IEC 61951-2:2022 clause 4 (docs/references.md §3) [published via 61951-2; memory for
// 61960-3 itself]: current ±1 %, voltage ±1 %, time ±0.1 %. Given here as test inputs, never as constants of the code.
const clause4: UncertaintySource[] = [
  { quantity: "current", source: "current measurement", tolerance: { form: "percent-of-reading", percent: 1 } },
  { quantity: "voltage", source: "voltage measurement", tolerance: { form: "percent-of-reading", percent: 1 } },
  { quantity: "time", source: "time measurement", tolerance: { form: "percent-of-reading", percent: 0.1 } },
];
const withoutVoltage = clause4.filter((s) => s.quantity !== "voltage");

describe("measurement uncertainty (JCGM 100:2008, GUM)", () => {
  // Source: GUM 4.3.7 [published]: a rectangular limit ±a has u = a/√3.
  it("turns a rectangular ±a into a/√3", () => {
    expect(computeStandardUncertainty(1)).toBeCloseTo(0.5773502692, 10);
    expect(computeStandardUncertainty(0.03)).toBeCloseTo(0.03 / Math.sqrt(3), 15);
  });

  // Source: docs/references.md §6 Example A; GUM 5.1.6 product rule, 4.3.7 rectangular, 6.2.1 / 6.3.3 k = 2 [published].
  it("Example A: 0.600 A for 5.10 h with clause-4 limits gives U = 1.1605 % = ±0.0355 Ah", () => {
    const result = evaluateCapacityUncertainty({ capacityAh: 3.06, currentA: 0.6, durationS: 5.1 * 3600, sources: withoutVoltage });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const [current, time] = result.value.rows;
    expectPercent(current!.relativeStandardUncertainty, 0.5774, 4);
    expectPercent(time!.relativeStandardUncertainty, 0.0577, 4);
    expect(current!.divisor).toBeCloseTo(Math.sqrt(3), 15);
    expect(current!.sensitivity).toBe(1);
    expectPercent(result.value.relativeCombinedStandardUncertainty, 0.5802, 4);
    expect(result.value.coverageFactor).toBe(2);
    expectPercent(result.value.relativeExpandedUncertainty, 1.1605, 4);
    expect(result.value.expandedUncertainty).toBeCloseTo(0.0355, 4);
  });

  // Source: docs/references.md §6 Example B (instrument ±(0.05 % rdg + 0.05 % of 5 A range), time base 100 ppm); GUM as above.
  it("Example B: a(I) = 0.0028 A, u_r(I) = 0.2694 %, u_r(Q) = 0.2695 %, U = 0.539 % = ±0.0165 Ah", () => {
    const current = { form: "percent-of-reading-and-range", percentOfReading: 0.05, percentOfRange: 0.05, range: 5 } as const;
    expect(computeHalfWidth(current, 0.6)).toBeCloseTo(0.0028, 15);
    const result = evaluateCapacityUncertainty({
      capacityAh: 3.06,
      currentA: 0.6,
      durationS: 5.1 * 3600,
      sources: [
        { quantity: "current", source: "cycler current channel", tolerance: current },
        { quantity: "time", source: "time base 100 ppm", tolerance: { form: "percent-of-reading", percent: 0.01 } },
      ],
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.rows[0]!.halfWidth).toBeCloseTo(0.0028, 15);
    expectPercent(result.value.rows[0]!.relativeStandardUncertainty, 0.2694, 4);
    expectPercent(result.value.relativeCombinedStandardUncertainty, 0.2695, 4);
    expectPercent(result.value.relativeExpandedUncertainty, 0.539, 3);
    expect(result.value.expandedUncertainty).toBeCloseTo(0.0165, 4);
  });

  // Source: docs/references.md §6 energy case: u_r(E) = √(0.577² + 0.577² + 0.0577²) = 0.8185 %, U = 1.637 % (GUM 5.1.6).
  it("energy with clause-4 limits: u_r(E) = 0.8185 %, U = 1.637 %", () => {
    const result = evaluateEnergyUncertainty({ energyWh: 10.4805, meanVoltageV: 3.425, currentA: 0.6, durationS: 5.1 * 3600, sources: clause4 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.rows.map((r) => r.quantity)).toEqual(["current", "voltage", "time"]);
    expectPercent(result.value.relativeCombinedStandardUncertainty, 0.8185, 4);
    expectPercent(result.value.relativeExpandedUncertainty, 1.637, 3);
  });

  // Source: docs/references.md §4 uncertainty note and GUM 5.2 (correlated inputs): for the 20.0 mΩ pulse (U1 = 3.9000 V,
  // U2 = 3.8520 V, I1 = 0.6 A, I2 = 3.0 A) with ±1 % limits, independent readings give an absurd ~±66 %; one channel's
  // gain taken as fully correlated leaves only the gain acting on the step, √(0.577² + 0.577²) = 0.8165 %.
  describe("DC resistance: correlated versus independent readings", () => {
    const readings = { u1V: 3.9, i1A: -0.6, u2V: 3.852, i2A: -3.0 };
    const onePercent = { percentOfReading: 1 };

    it("independent treatment inflates u_r(Rdc) to about 66 %", () => {
      const result = evaluateDcResistanceUncertainty({ readings, voltage: onePercent, current: onePercent, correlation: "independent" });
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      expect(result.value.value).toBeCloseTo(0.02, 12);
      expect(result.value.relativeCombinedStandardUncertainty).toBeGreaterThan(0.655);
      expect(result.value.relativeCombinedStandardUncertainty).toBeLessThan(0.665);
      // The sensitivity of R to U1 is U1/(U1 − U2) = 81.25: a 1 % limit on 3.9 V swamps a 48 mV step.
      expect(result.value.rows.find((r) => r.quantity === "U1")!.sensitivity).toBeCloseTo(81.25, 10);
    });

    it("same-channel treatment gives a small u_r(Rdc) of 0.8165 % (U = 1.633 %, about ±0.33 mΩ)", () => {
      const result = evaluateDcResistanceUncertainty({ readings, voltage: onePercent, current: onePercent, correlation: "same-channel" });
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      expectPercent(result.value.relativeCombinedStandardUncertainty, 0.8165, 4);
      expectPercent(result.value.relativeExpandedUncertainty, 1.633, 3);
      expect(result.value.expandedUncertainty).toBeCloseTo(0.000327, 6);
    });
  });
});

// The same examples reached the way a run reaches them: the cycler channel's accuracy as the instrument register
// states it (percent of reading and range, time base in ppm), turned into sources and budgets at the discharge
// step's readings (Q = 3.060 Ah over t = 5.10 h, so Ī = Q / t = 0.600 A; E = 10.4805 Wh at a mean 3.425 V, docs/references.md §5).
describe("budgets from the instrument register (docs/references.md §6 through a run's cycler channel)", () => {
  const discharge = { capacityAh: 3.06, durationS: 5.1 * 3600, energyWh: 10.4805, meanVoltageV: 3.425 } as StepResults;
  const budgetsOf = (accuracy: RunInstrument["accuracy"]) => {
    const { budgets, notEvaluated } = evaluateStepUncertainties({
      steps: [{ stepId: "discharge", cycle: 1, kind: "discharge", results: discharge, dcResistance: null }],
      instruments: [{ identifier: "CH-REF", kind: "cycler-channel", accuracy }],
    });
    expect(notEvaluated).toEqual([]);
    const find = (quantity: string) => budgets.find((entry) => entry.quantity === quantity)!.budget;
    return { capacity: find("capacity"), energy: find("energy") };
  };

  // Source: docs/references.md §6 Example B: ±(0.05 % rdg + 0.05 % of 5 A range), time base 100 ppm.
  it("Example B: U = 0.539 % = ±0.0165 Ah on 3.060 Ah", () => {
    const { capacity } = budgetsOf({
      current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
      voltage: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
      time: { ppm: 100 },
    });
    expect(capacity.rows[0]!.halfWidth).toBeCloseTo(0.0028, 12);
    expectPercent(capacity.rows[0]!.relativeStandardUncertainty, 0.2694, 4);
    expectPercent(capacity.relativeCombinedStandardUncertainty, 0.2695, 4);
    expectPercent(capacity.relativeExpandedUncertainty, 0.539, 3);
    expect(capacity.expandedUncertainty).toBeCloseTo(0.0165, 4);
  });

  // Source: docs/references.md §3 clause-4 limits as a channel's accuracy (±1 % current and voltage, ±0.1 % = 1 000 ppm time);
  // §6 Example A and the energy case.
  it("Example A and the energy case: U(Q) = 1.1605 % = ±0.0355 Ah, U(E) = 1.637 %", () => {
    const { capacity, energy } = budgetsOf({
      current: { percentOfReading: 1, percentOfRange: 0, range: 5 },
      voltage: { percentOfReading: 1, percentOfRange: 0, range: 5 },
      time: { ppm: 1000 },
    });
    expectPercent(capacity.relativeCombinedStandardUncertainty, 0.5802, 4);
    expectPercent(capacity.relativeExpandedUncertainty, 1.1605, 4);
    expect(capacity.expandedUncertainty).toBeCloseTo(0.0355, 4);
    expectPercent(energy.relativeCombinedStandardUncertainty, 0.8185, 4);
    expectPercent(energy.relativeExpandedUncertainty, 1.637, 3);
  });
});
