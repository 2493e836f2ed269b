import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createOcvFunction, exampleOcvCurve } from "@/lib/analysis/cell-model";
import { createSeededRandom } from "@/lib/analysis/seeded-random";
import { generateSyntheticLog, type SyntheticLogOptions } from "@/lib/analysis/synthetic-log";

const plan: SyntheticLogOptions = {
  cell: { capacityMAh: 3000, seriesResistanceOhm: 0.025, initialSoc: 0.3 },
  steps: [
    { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.06 },
    { kind: "rest", durationS: 600 },
    { kind: "discharge", currentA: 3, endVoltageV: 3.0 },
  ],
  seed: 1,
  sampleIntervalS: 10,
  temperature: { ambientC: 25, driftCPerHour: 0.5 },
};

describe("seeded random numbers", () => {
  it("repeat for a seed and look uniform and normal", () => {
    const a = createSeededRandom(99);
    const b = createSeededRandom(99);
    const uniform = Array.from({ length: 20_000 }, () => a.nextUniform());
    expect(Array.from({ length: 20_000 }, () => b.nextUniform())).toEqual(uniform);
    expect(uniform.every((u) => u >= 0 && u < 1)).toBe(true);
    expect(uniform.reduce((s, u) => s + u, 0) / uniform.length).toBeCloseTo(0.5, 2);
    const normal = Array.from({ length: 20_000 }, () => a.nextNormal());
    const mean = normal.reduce((s, x) => s + x, 0) / normal.length;
    const variance = normal.reduce((s, x) => s + (x - mean) ** 2, 0) / (normal.length - 1);
    expect(Math.abs(mean)).toBeLessThan(0.03);
    expect(Math.abs(variance - 1)).toBeLessThan(0.05);
  });
});

describe("generateSyntheticLog", () => {
  it("is deterministic for a seed, and another seed gives another log", () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        const a = generateSyntheticLog({ ...plan, seed });
        const b = generateSyntheticLog({ ...plan, seed });
        const c = generateSyntheticLog({ ...plan, seed: seed ^ 0x5a5a });
        if (!a.ok || !b.ok || !c.ok) return false;
        const same = (x: Float64Array, y: Float64Array) => x.length === y.length && x.every((v, k) => Object.is(v, y[k]));
        const { columns: ca } = a.value;
        const { columns: cb } = b.value;
        return (
          same(ca.timeS, cb.timeS) &&
          same(ca.voltageV, cb.voltageV) &&
          same(ca.currentA, cb.currentA) &&
          same(ca.temperatureC!, cb.temperatureC!) &&
          !same(ca.voltageV, c.value.columns.voltageV)
        );
      }),
      { numRuns: 10 },
    );
  });

  it("samples irregularly within the jitter, with time always increasing", () => {
    const result = generateSyntheticLog({ ...plan, samplingJitter: 0.3 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { timeS, length } = result.value.columns;
    const intervals = Array.from({ length: length - 1 }, (_, k) => (timeS[k + 1] as number) - (timeS[k] as number));
    expect(Math.min(...intervals)).toBeGreaterThanOrEqual(7);
    expect(Math.max(...intervals)).toBeLessThanOrEqual(13);
    expect(new Set(intervals.map((d) => d.toFixed(3))).size).toBeGreaterThan(100);
  });

  it("follows the cell model: CC up to the charge voltage, CV to the termination current, discharge to the end voltage", () => {
    const result = generateSyntheticLog({ ...plan, noise: { voltageV: 0, currentA: 0, temperatureC: 0 } });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { columns, steps } = result.value;
    const [charge, rest, discharge] = steps;
    const v = columns.voltageV;
    const c = columns.currentA;
    expect(c[charge!.from]).toBe(1.5);
    expect(Math.max(...v.subarray(charge!.from, charge!.to + 1))).toBeLessThanOrEqual(4.2 + 1e-12);
    expect(c[charge!.to]).toBeLessThanOrEqual(0.06);
    expect(c[charge!.to - 1]).toBeGreaterThan(0.06);
    expect(v[charge!.to]).toBeCloseTo(4.2, 12);
    expect(Array.from(c.subarray(rest!.from, rest!.to + 1)).every((i) => i === 0)).toBe(true);
    expect(v[discharge!.to]).toBeLessThanOrEqual(3.0);
    expect(v[discharge!.to - 1]).toBeGreaterThan(3.0);
    // At rest the terminal voltage is the OCV; under 3 A it sits 3 A × 25 mΩ = 75 mV lower.
    expect((v[rest!.to] as number) - (v[discharge!.from] as number)).toBeCloseTo(0.075, 3);
    // The temperature drifts 0.5 °C per hour from 25 °C.
    const lastT = columns.temperatureC![columns.length - 1] as number;
    const hours = (columns.timeS[columns.length - 1] as number) / 3600;
    expect(lastT).toBeGreaterThan(25 + 0.5 * hours - 0.2);
    expect(lastT).toBeLessThan(25 + 0.5 * hours + 0.05);
    expect(Array.from(columns.cyclerStep!.subarray(rest!.from, rest!.to + 1)).every((s) => s === 2)).toBe(true);
  });

  it("leaves out the temperature column when no temperature is asked for", () => {
    const withoutTemperature = { ...plan };
    delete withoutTemperature.temperature;
    const result = generateSyntheticLog(withoutTemperature);
    expect(result.ok && result.value.columns.temperatureC).toBeUndefined();
  });

  it("refuses impossible settings with a clear message", () => {
    const badCell = generateSyntheticLog({ ...plan, cell: { ...plan.cell, capacityMAh: 0 } });
    expect(badCell.ok || badCell.error.code).toBe("invalid-input");
    const badStep = generateSyntheticLog({ ...plan, steps: [{ kind: "charge", currentA: 1, voltageV: 4.2, terminationCurrentA: 2 }] });
    expect(badStep.ok || badStep.error.message).toContain("Step 1 (charge)");
    const badCurve = createOcvFunction([{ soc: 0, voltageV: 3 }, { soc: 0.5, voltageV: 2.9 }]);
    expect(badCurve.ok || badCurve.error.code).toBe("invalid-input");
    const tooMany = generateSyntheticLog({ ...plan, maxSamples: 100 });
    expect(tooMany.ok || tooMany.error.code).toBe("too-many-samples");
  });

  it("interpolates the OCV curve and extends it past both ends", () => {
    const ocv = createOcvFunction(exampleOcvCurve);
    expect(ocv.ok).toBe(true);
    if (!ocv.ok) return;
    expect(ocv.value(0.5)).toBeCloseTo(3.72, 12);
    expect(ocv.value(0.6)).toBeCloseTo(3.8, 12);
    expect(ocv.value(1.05)).toBeGreaterThan(4.2);
    expect(ocv.value(-0.01)).toBeLessThan(3.0);
  });

  it("produces 2 million rows in one call", () => {
    const result = generateSyntheticLog({
      cell: { capacityMAh: 5000, seriesResistanceOhm: 0.02, initialSoc: 0.5 },
      steps: [{ kind: "rest", durationS: 200_000 }],
      seed: 3,
      sampleIntervalS: 0.1,
      samplingJitter: 0,
    });
    expect(result.ok && result.value.columns.length).toBeGreaterThanOrEqual(2_000_000);
    // Allowance for a loaded 2-core CI machine (5 s by default); a guard, not a speed target.
  }, 30_000);
});
