import { describe, expect, it } from "vitest";
import { segment, type Phase } from "@/lib/analysis/segment";
import { computeStepResults } from "@/lib/analysis/step-results";
import { generateSyntheticLog } from "@/lib/analysis/synthetic-log";
import { createLog } from "./log-arbitrary";

describe("computeStepResults", () => {
  it("reports voltages, current statistics and temperature of a hand-made discharge", () => {
    const log = createLog([
      { t: 0, v: 4.0, i: -1.0, temperature: 23 },
      { t: 10, v: 3.9, i: -1.2, temperature: 24.5 },
      { t: 20, v: 3.95, i: -0.8, temperature: 24 },
      { t: 30, v: 3.7, i: -1.0, temperature: 23.5 },
    ]);
    const phase: Phase = { kind: "discharge", from: 0, to: 3, startS: 0, endS: 30, pulse: null };
    const result = computeStepResults(log, phase);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value).toMatchObject({
      durationS: 30,
      startVoltageV: 4.0,
      endVoltageV: 3.7,
      minVoltageV: 3.7,
      maxVoltageV: 4.0,
      maxTemperatureC: 24.5,
      cvTerminationCurrentA: null,
    });
    // Trapezoid: 10 s × (1.1 + 1.0 + 0.9) A = 30 A·s.
    expect(result.value.capacityAh).toBeCloseTo(30 / 3600, 15);
    expect(result.value.capacityMAh).toBeCloseTo(30 / 3.6, 12);
    expect(result.value.constantCurrent?.meanA).toBeCloseTo(1.0, 15);
    // Sample standard deviation of 1.0, 1.2, 0.8, 1.0 (n − 1 = 3).
    expect(result.value.constantCurrent?.standardDeviationA).toBeCloseTo(Math.sqrt(0.08 / 3), 15);
  });

  it("gives no CC statistics for a rest and no temperature when the log has none", () => {
    const log = createLog([
      { t: 0, v: 3.6, i: 0 },
      { t: 5, v: 3.61, i: 0 },
    ]);
    const result = computeStepResults(log, { kind: "rest", from: 0, to: 1, startS: 0, endS: 5 });
    expect(result.ok && result.value).toMatchObject({ constantCurrent: null, maxTemperatureC: null, meanVoltageV: null, capacityAh: 0 });
  });

  it("passes on a bad range as a typed error", () => {
    const log = createLog([{ t: 0, v: 3.6, i: 0 }]);
    const result = computeStepResults(log, { kind: "rest", from: 0, to: 5, startS: 0, endS: 0 });
    expect(result.ok || result.error.code).toBe("invalid-range");
  });

  it("reads the programmed current, the noise, the CV end and the warming back out of a synthetic log", () => {
    const log = generateSyntheticLog({
      cell: { capacityMAh: 2500, seriesResistanceOhm: 0.03, initialSoc: 0.2 },
      steps: [
        { kind: "charge", currentA: 1.25, voltageV: 4.2, terminationCurrentA: 0.05 },
        { kind: "rest", durationS: 1800 },
        { kind: "discharge", currentA: 0.5, endVoltageV: 2.75 },
      ],
      seed: 42,
      sampleIntervalS: 5,
      noise: { currentA: 0.001 },
      temperature: { ambientC: 20, heatingCPerW: 10, timeConstantS: 300 },
    });
    expect(log.ok).toBe(true);
    if (!log.ok) return;
    const phases = segment(log.value.columns);
    expect(phases.ok && phases.value.map((p) => p.kind)).toEqual(["charge", "rest", "discharge"]);
    if (!phases.ok) return;
    const [charge, , discharge] = phases.value.map((p) => computeStepResults(log.value.columns, p));
    expect(charge?.ok && discharge?.ok).toBe(true);
    if (!charge?.ok || !discharge?.ok) return;
    expect(charge.value.constantCurrent?.meanA).toBeCloseTo(1.25, 3);
    expect(charge.value.constantCurrent?.standardDeviationA).toBeGreaterThan(0.0008);
    expect(charge.value.constantCurrent?.standardDeviationA).toBeLessThan(0.0012);
    expect(charge.value.maxVoltageV).toBeGreaterThan(4.199);
    expect(charge.value.maxVoltageV).toBeLessThan(4.205);
    expect(charge.value.cvTerminationCurrentA).toBeLessThanOrEqual(0.05 + 0.004);
    expect(charge.value.cvTerminationCurrentA).toBeGreaterThan(0.04);
    // 1.25² A² × 0.03 Ω × 10 °C/W ≈ 0.47 °C of warming at most during CC.
    expect(charge.value.maxTemperatureC).toBeGreaterThan(20.3);
    expect(charge.value.maxTemperatureC).toBeLessThan(20.7);
    expect(discharge.value.constantCurrent?.meanA).toBeCloseTo(0.5, 3);
    expect(discharge.value.endVoltageV).toBeLessThan(2.76);
    expect(discharge.value.capacityAh).toBeCloseTo((0.5 * discharge.value.durationS) / 3600, 4);
  });
});
