import { describe, expect, it } from "vitest";
import { computeAcResistance, computeDcResistance, evaluateDcResistancePulse } from "@/lib/analysis/internal-resistance";
import type { LogColumns } from "@/lib/analysis/log-columns";

describe("internal resistance", () => {
  // Source: docs/references.md §4, IEC 61960-3 7.7 DC method [memory, high confidence]: Rdc = (U1 − U2)/(I2 − I1),
  // I1 = 0.2 It = 0.6 A, I2 = 1.0 It = 3.0 A for Cn = 3.0 Ah (discharge; negative in our sign convention).
  it("DC: U1 = 3.9000 V at 0.6 A, U2 = 3.8520 V at 3.0 A gives 20.0 mΩ", () => {
    const result = computeDcResistance({ u1V: 3.9, i1A: -0.6, u2V: 3.852, i2A: -3.0 });
    expect(result.ok && result.value).toBeCloseTo(0.02, 12);
  });

  // Source: docs/references.md §4 DC check [memory, high confidence], read from a log slice: 10 s base, 1 s pulse at 0.1 s sampling.
  it("DC: the same readings found at the end of each level in a log give 20.0 mΩ", () => {
    const timeS: number[] = [];
    const voltageV: number[] = [];
    const currentA: number[] = [];
    // rest, then base level (0.6 A, 10 s), then pulse level (3.0 A, 1 s), then rest
    const add = (t: number, v: number, i: number) => {
      timeS.push(t);
      voltageV.push(v);
      currentA.push(i);
    };
    for (let k = 0; k <= 20; k++) add(k * 0.1, 3.92, 0);
    for (let k = 1; k <= 100; k++) add(2 + k * 0.1, 3.9, -0.6);
    for (let k = 1; k <= 10; k++) add(12 + k * 0.1, 3.852, -3.0);
    for (let k = 1; k <= 20; k++) add(13 + k * 0.1, 3.92, 0);
    const columns: LogColumns = {
      timeS: Float64Array.from(timeS),
      voltageV: Float64Array.from(voltageV),
      currentA: Float64Array.from(currentA),
      length: timeS.length,
    };
    const result = evaluateDcResistancePulse(columns, { from: 21, to: 130 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.base).toEqual({ from: 21, to: 120 });
    expect(result.value.pulse).toEqual({ from: 121, to: 130 });
    expect(result.value.resistanceOhm).toBeCloseTo(0.02, 12);
  });

  // Source: docs/references.md §4, IEC 61960-3 7.7 AC method [memory]: Rac = Ua / Ia.
  it("AC: 1.8 mV rms at 0.1 A rms gives 18.0 mΩ", () => {
    const result = computeAcResistance({ voltageRmsV: 0.0018, currentRmsA: 0.1 });
    expect(result.ok && result.value).toBeCloseTo(0.018, 12);
  });
});
