import { describe, expect, it } from "vitest";
import { integrate } from "@/lib/analysis/integrate";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { segment } from "@/lib/analysis/segment";
import { computeStepResults } from "@/lib/analysis/step-results";

function createColumns(timeS: number[] | Float64Array, voltageV: number[] | Float64Array, currentA: number): LogColumns {
  return {
    timeS: Float64Array.from(timeS),
    voltageV: Float64Array.from(voltageV),
    currentA: new Float64Array(timeS.length).fill(currentA),
    length: timeS.length,
  };
}

describe("capacity and energy by the trapezoid rule", () => {
  // Source: docs/references.md §5, first example — definitions Q = ∫|I| dt, E = ∫V·|I| dt, mean V = E/Q (exact arithmetic).
  it("0.6 A with V falling linearly 4.10 V → 2.75 V over 5.1 h, 1 s samples: 3.060 Ah, 10.4805 Wh, 3.425 V", () => {
    const seconds = 5.1 * 3600;
    const timeS = Float64Array.from({ length: seconds + 1 }, (_, i) => i);
    const voltageV = timeS.map((t) => 4.1 - (1.35 * t) / seconds);
    const columns = createColumns(timeS, voltageV, -0.6);
    const result = integrate(columns, { from: 0, to: columns.length - 1 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Math.abs(result.value.capacityAh - 3.06)).toBeLessThan(1e-9);
    expect(Math.abs(result.value.energyWh - 10.4805)).toBeLessThan(1e-9);
    expect(Math.abs((result.value.meanVoltageV ?? 0) - 3.425)).toBeLessThan(1e-9);
    expect(result.value.durationS).toBe(18_360);
  });

  // Source: docs/references.md §5, first example again, through segmentation and step results (same definitions).
  it("the same log segmented gives one discharge step of 3 060 mAh", () => {
    const seconds = 5.1 * 3600;
    const timeS = Float64Array.from({ length: seconds + 1 }, (_, i) => i);
    const columns = createColumns(timeS, timeS.map((t) => 4.1 - (1.35 * t) / seconds), -0.6);
    const phases = segment(columns);
    expect(phases.ok && phases.value.map((p) => p.kind)).toEqual(["discharge"]);
    if (!phases.ok) return;
    const step = computeStepResults(columns, phases.value[0]!);
    expect(step.ok).toBe(true);
    if (!step.ok) return;
    expect(Math.abs(step.value.capacityMAh - 3060)).toBeLessThan(1e-6);
    expect(step.value.endVoltageV).toBeCloseTo(2.75, 12);
    expect(step.value.constantCurrent?.meanA).toBeCloseTo(0.6, 12);
  });

  // Source: docs/references.md §5, second example — trapezoid over hourly samples (definition, exact arithmetic).
  it("0.6 A sampled hourly at 4.10, 3.90, 3.75, 3.65, 3.50, 3.00 V: 3.000 Ah, 11.010 Wh, 3.670 V", () => {
    const columns = createColumns([0, 1, 2, 3, 4, 5].map((h) => h * 3600), [4.1, 3.9, 3.75, 3.65, 3.5, 3.0], -0.6);
    const result = integrate(columns, { from: 0, to: 5 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.capacityAh).toBeCloseTo(3.0, 12);
    expect(result.value.energyWh).toBeCloseTo(11.01, 12);
    expect(result.value.meanVoltageV).toBeCloseTo(3.67, 12);
  });
});
