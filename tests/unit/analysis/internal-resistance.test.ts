import { describe, expect, it } from "vitest";
import { computeDcResistance, evaluateDcResistancePulse } from "@/lib/analysis/internal-resistance";
import { findPulseLevels } from "@/lib/analysis/pulse-levels";
import { segment } from "@/lib/analysis/segment";
import { generateSyntheticLog } from "@/lib/analysis/synthetic-log";
import { createLog } from "./log-arbitrary";

function createLevels(levels: [samples: number, currentA: number, voltageV: number][]) {
  const samples: { t: number; v: number; i: number }[] = [];
  for (const [count, i, v] of levels) for (let k = 0; k < count; k++) samples.push({ t: samples.length * 0.1, v, i });
  return createLog(samples);
}

describe("findPulseLevels", () => {
  it("skips a short ramp between the levels", () => {
    const log = createLevels([
      [50, -0.6, 3.9],
      [1, -1.8, 3.87],
      [10, -3.0, 3.852],
    ]);
    const result = findPulseLevels(log, { from: 0, to: 60 });
    expect(result.ok && result.value).toMatchObject({ base: { from: 0, to: 49 }, pulse: { from: 51, to: 60 } });
  });

  it("accepts a rest as the base level", () => {
    const log = createLevels([
      [30, 0, 3.95],
      [10, -2, 3.91],
    ]);
    const result = evaluateDcResistancePulse(log, { from: 0, to: 39 });
    expect(result.ok && result.value.resistanceOhm).toBeCloseTo(0.02, 12);
  });

  it("finds no pulse in a falling CV current, a single level, or a step up longer than its base", () => {
    const cv = createLog(Array.from({ length: 200 }, (_, k) => ({ t: k, v: 4.2, i: 1.5 * Math.exp(-k / 40) })));
    const falling = findPulseLevels(cv, { from: 0, to: 199 });
    expect(falling.ok || falling.error.code).toBe("no-pulse-found");
    const flat = findPulseLevels(createLevels([[40, -1, 3.7]]), { from: 0, to: 39 });
    expect(flat.ok).toBe(false);
    const stepped = findPulseLevels(createLevels([[10, -0.5, 3.7], [100, -2, 3.65]]), { from: 0, to: 109 });
    expect(stepped.ok).toBe(false);
  });

  it("does not take a reversal of direction for a pulse", () => {
    const log = createLevels([
      [50, -0.6, 3.9],
      [10, 3.0, 3.95],
    ]);
    expect(findPulseLevels(log, { from: 0, to: 59 }).ok).toBe(false);
  });
});

describe("DC resistance from a log", () => {
  it("recovers the model's series resistance from a synthetic pulse found by segmentation", () => {
    const log = generateSyntheticLog({
      cell: { capacityMAh: 3000, seriesResistanceOhm: 0.025, initialSoc: 0.6 },
      steps: [
        { kind: "rest", durationS: 60 },
        { kind: "pulse", baseCurrentA: 0.6, baseDurationS: 10, pulseCurrentA: 3, pulseDurationS: 1, sampleIntervalS: 0.1 },
        { kind: "rest", durationS: 60 },
      ],
      seed: 8,
      noise: { voltageV: 0.0001, currentA: 0.0005 },
    });
    expect(log.ok).toBe(true);
    if (!log.ok) return;
    const phases = segment(log.value.columns);
    expect(phases.ok && phases.value.map((p) => p.kind)).toEqual(["rest", "discharge", "rest"]);
    if (!phases.ok) return;
    const pulse = phases.value[1]!;
    expect(pulse.kind === "discharge" && pulse.pulse).toBeTruthy();
    const result = evaluateDcResistancePulse(log.value.columns, pulse);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    // 48 mV ± 0.1 mV noise per reading, plus the OCV falling a little over the 1 s pulse.
    expect(result.value.resistanceOhm).toBeGreaterThan(0.025 * 0.98);
    expect(result.value.resistanceOhm).toBeLessThan(0.025 * 1.03);
  });

  it("refuses equal currents", () => {
    const result = computeDcResistance({ u1V: 3.9, i1A: -1, u2V: 3.8, i2A: -1 });
    expect(result.ok || result.error.code).toBe("invalid-input");
  });
});
