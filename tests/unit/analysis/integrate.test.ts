import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { integrate } from "@/lib/analysis/integrate";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { arbitraryLog, createLog } from "./log-arbitrary";

const close = (a: number, b: number, scale: number) => Math.abs(a - b) <= 1e-12 * Math.max(1, scale);

describe("integrate", () => {
  it("is additive over a range split at a shared sample", () => {
    fc.assert(
      fc.property(arbitraryLog, fc.double({ min: 0, max: 1, noNaN: true }), (log, where) => {
        const last = log.length - 1;
        const split = Math.round(where * last);
        const whole = integrate(log, { from: 0, to: last });
        const left = integrate(log, { from: 0, to: split });
        const right = integrate(log, { from: split, to: last });
        if (!whole.ok || !left.ok || !right.ok) return false;
        return (
          close(left.value.capacityAh + right.value.capacityAh, whole.value.capacityAh, whole.value.capacityAh) &&
          close(left.value.energyWh + right.value.energyWh, whole.value.energyWh, whole.value.energyWh) &&
          close(left.value.durationS + right.value.durationS, whole.value.durationS, whole.value.durationS)
        );
      }),
    );
  });

  it("treats a change of units (mA for A, minutes for seconds) as a pure scale, so converting before or after agrees", () => {
    fc.assert(
      fc.property(arbitraryLog, (log) => {
        // The same samples as a cycler logging mA and minutes holds them, fed to the kernel unconverted.
        const raw: LogColumns = { ...log, currentA: log.currentA.map((i) => i * 1000), timeS: log.timeS.map((t) => t / 60) };
        const si = integrate(log, { from: 0, to: log.length - 1 });
        const asLogged = integrate(raw, { from: 0, to: log.length - 1 });
        if (!si.ok || !asLogged.ok) return false;
        // Integrating mA over minutes gives 1000/60 times the ampere-second figure.
        const scale = 1000 / 60;
        return (
          close(asLogged.value.capacityAh / scale, si.value.capacityAh, si.value.capacityAh) &&
          close(asLogged.value.energyWh / scale, si.value.energyWh, si.value.energyWh) &&
          (si.value.meanVoltageV === null || close(asLogged.value.meanVoltageV ?? 0, si.value.meanVoltageV, 4))
        );
      }),
    );
  });

  it("scales with the current and ignores its sign", () => {
    fc.assert(
      fc.property(arbitraryLog, fc.double({ min: 0.001, max: 1000, noNaN: true }), (log, factor) => {
        const scaled = { ...log, currentA: log.currentA.map((i) => -i * factor) };
        const a = integrate(log, { from: 0, to: log.length - 1 });
        const b = integrate(scaled, { from: 0, to: log.length - 1 });
        if (!a.ok || !b.ok) return false;
        return Math.abs(b.value.capacityAh - factor * a.value.capacityAh) <= 1e-12 * Math.max(1, b.value.capacityAh);
      }),
    );
  });

  it("gives zero and no mean voltage for a single sample or no current", () => {
    const log = createLog([
      { t: 0, v: 3.7, i: 0 },
      { t: 10, v: 3.7, i: 0 },
    ]);
    const single = integrate(log, { from: 1, to: 1 });
    expect(single.ok && single.value).toEqual({ capacityAh: 0, energyWh: 0, meanVoltageV: null, durationS: 0 });
    const rest = integrate(log, { from: 0, to: 1 });
    expect(rest.ok && rest.value.meanVoltageV).toBeNull();
    expect(rest.ok && rest.value.durationS).toBe(10);
  });

  it("returns typed errors for a bad range, time running backwards and missing numbers", () => {
    const log = createLog([
      { t: 0, v: 3.7, i: 1 },
      { t: 1, v: 3.7, i: 1 },
      { t: 1, v: 3.7, i: 1 },
      { t: 2, v: Number.NaN, i: 1 },
    ]);
    const outside = integrate(log, { from: 0, to: 4 });
    expect(outside.ok || outside.error.code).toBe("invalid-range");
    const reversed = integrate(log, { from: 2, to: 1 });
    expect(reversed.ok || reversed.error.code).toBe("invalid-range");
    const stuck = integrate(log, { from: 0, to: 2 });
    expect(stuck.ok || stuck.error).toMatchObject({ code: "time-not-increasing", message: expect.stringContaining("sample 2") });
    const missing = integrate(log, { from: 2, to: 3 });
    expect(missing.ok || missing.error.code).toBe("non-finite-value");
    const short = integrate({ ...log, length: 10 }, { from: 0, to: 1 });
    expect(short.ok || short.error.code).toBe("invalid-input");
  });

  it("integrates across block boundaries of a long log exactly like the definition", () => {
    const n = 10_000;
    const log = createLog(Array.from({ length: n }, (_, k) => ({ t: k * 0.5, v: 4, i: k % 2 === 0 ? -1 : -3 })));
    const result = integrate(log, { from: 0, to: n - 1 });
    // Every interval averages 2 A over 0.5 s: Q = 2 A × (n − 1)·0.5 s; E = 4 V × Q.
    expect(result.ok && result.value.capacityAh).toBeCloseTo((2 * (n - 1) * 0.5) / 3600, 12);
    expect(result.ok && result.value.energyWh).toBeCloseTo((8 * (n - 1) * 0.5) / 3600, 12);
  });
});
