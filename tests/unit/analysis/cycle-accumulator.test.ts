import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { createCycleAccumulator, type CycleResult } from "@/lib/analysis/cycle-accumulator";
import { integrate } from "@/lib/analysis/integrate";
import type { LogColumns } from "@/lib/analysis/log-columns";
import { segment } from "@/lib/analysis/segment";
import { enduranceLogPlan, expectedEnduranceCycle, generateEnduranceLog, type EnduranceLogPlan } from "@/scenarios/endurance-log";

/** One piece of columns from a list of [time s, voltage V, current A]. */
function columnsOf(rows: readonly (readonly [number, number, number])[]): LogColumns {
  return {
    timeS: Float64Array.from(rows, (r) => r[0]),
    voltageV: Float64Array.from(rows, (r) => r[1]),
    currentA: Float64Array.from(rows, (r) => r[2]),
    length: rows.length,
  };
}

/** Charge, rest, discharge, rest, with constant currents and straight voltages: every integral by hand. */
function handLog(): LogColumns {
  const rows: [number, number, number][] = [];
  let t = 0;
  const line = (n: number, v0: number, v1: number, i: number) => {
    for (let j = 0; j <= n; j++) rows.push([t++, v0 + ((v1 - v0) * j) / n, i]);
  };
  const rest = (n: number, v: number) => {
    for (let j = 0; j < n; j++) rows.push([t++, v, 0]);
  };
  // Cycle 1: 1 A for 3 600 s, 3.6 → 4.2 V; rest; 2 A for 1 620 s, 4.0 → 3.0 V; rest.
  line(3600, 3.6, 4.2, 1);
  rest(600, 4.15);
  line(1620, 4.0, 3.0, -2);
  rest(600, 3.4);
  // Cycle 2: 1.5 A for 2 400 s, 3.6 → 4.2 V; rest; 3 A for 1 080 s, 4.0 → 3.0 V; rest.
  line(2400, 3.6, 4.2, 1.5);
  rest(600, 4.15);
  line(1080, 4.0, 3.0, -3);
  rest(300, 3.4);
  return columnsOf(rows);
}

function feedAll(columns: LogColumns, cuts: number[]): CycleResult[] {
  const acc = createCycleAccumulator();
  if (!acc.ok) throw new Error(acc.error.message);
  const results: CycleResult[] = [];
  let state = acc.value.saveState();
  let from = 0;
  for (const to of [...cuts, columns.length]) {
    // Each piece through a fresh accumulator restored from the state the last one saved (as each log part is).
    const next = createCycleAccumulator({}, JSON.parse(JSON.stringify(state)));
    if (!next.ok) throw new Error(next.error.message);
    const piece = { timeS: columns.timeS.subarray(from, to), voltageV: columns.voltageV.subarray(from, to), currentA: columns.currentA.subarray(from, to), length: to - from };
    const pushed = next.value.push(piece);
    if (!pushed.ok) throw new Error(pushed.error.message);
    mergeResults(results, next.value.takeResults());
    state = next.value.saveState();
    from = to;
  }
  return results;
}

/** Later reports of a cycle replace earlier ones (as the table's upsert does). */
function mergeResults(into: CycleResult[], more: CycleResult[]): void {
  for (const r of more) {
    const at = into.findIndex((x) => x.cycle === r.cycle);
    if (at >= 0) into[at] = r;
    else into.push(r);
  }
}

describe("the per-cycle accumulator", () => {
  it("gives the hand-worked capacities, energies and efficiencies of two cycles", () => {
    const results = feedAll(handLog(), []);
    expect(results.map((r) => r.cycle)).toEqual([1, 2]);
    const [one, two] = results as [CycleResult, CycleResult];
    // Cycle 1: Q_ch = 1 A × 3 600 s = 1 Ah; E_ch = 1 Ah × (3.6 + 4.2)/2 V = 3.9 Wh.
    expect(one.chargeAh).toBeCloseTo(1, 12);
    expect(one.chargeWh).toBeCloseTo(3.9, 12);
    // Q_dis = 2 A × 1 620 s = 0.9 Ah; E_dis = 0.9 Ah × 3.5 V = 3.15 Wh.
    expect(one.dischargeAh).toBeCloseTo(0.9, 12);
    expect(one.dischargeWh).toBeCloseTo(3.15, 12);
    // Coulombic 0.9 / 1 = 0.9; energy 3.15 / 3.9 = 0.807 692 307 7.
    expect(one.coulombicEfficiency).toBeCloseTo(0.9, 12);
    expect(one.energyEfficiency).toBeCloseTo(0.8076923077, 9);
    expect(one.endOfChargeV).toBeCloseTo(4.2, 12);
    expect(one.endOfDischargeV).toBeCloseTo(3.0, 12);
    expect(one.dcResistanceOhm).toBeNull();
    expect(one.firstTimeS).toBe(0);
    expect(one.closed).toBe(true);
    // Cycle 2: Q_ch = 1.5 × 2 400 / 3 600 = 1 Ah; Q_dis = 3 × 1 080 / 3 600 = 0.9 Ah; same energies.
    expect(two.chargeAh).toBeCloseTo(1, 12);
    expect(two.dischargeAh).toBeCloseTo(0.9, 12);
    expect(two.dischargeWh).toBeCloseTo(3.15, 12);
    expect(two.coulombicEfficiency).toBeCloseTo(0.9, 12);
    // The last cycle is reported once its discharge has ended, still open.
    expect(two.closed).toBe(false);
    expect(two.firstTimeS).toBe(3601 + 600 + 1621 + 600);
    expect(two.lastTimeS).toBe(handLog().length - 1);
  });

  it("agrees with segment() + integrate() on every cycle's phases", () => {
    const log = handLog();
    const phases = segment(log);
    if (!phases.ok) throw new Error(phases.error.message);
    const sums = phases.value.filter((p) => p.kind !== "rest").map((p) => integrate(log, p));
    const results = feedAll(log, []);
    const flat = results.flatMap((r) => [r.chargeAh, r.dischargeAh]);
    expect(sums.map((s) => (s.ok ? s.value.capacityAh : Number.NaN))).toEqual(flat.map((x) => expect.closeTo(x, 12)));
  });

  it("gives the same results, to the bit, whatever the log is cut into", () => {
    const log = handLog();
    const whole = feedAll(log, []);
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: log.length - 1 }), { maxLength: 6 }), (cuts) => {
        expect(feedAll(log, [...cuts].sort((a, b) => a - b))).toEqual(whole);
      }),
      { numRuns: 40 },
    );
  });

  it("reads the DC resistance of a two-level pulse inside a discharge (docs/references.md §4: 20.0 mΩ)", () => {
    const plan: EnduranceLogPlan = { ...enduranceLogPlan, cycles: 3, pulseEveryCycles: 2 };
    const acc = createCycleAccumulator();
    if (!acc.ok) throw new Error(acc.error.message);
    for (const chunk of generateEnduranceLog(plan, 4096)) expect(acc.value.push(chunk).ok).toBe(true);
    const results = acc.value.takeResults();
    expect(results.map((r) => r.dcResistanceOhm === null)).toEqual([true, false, true]);
    expect(results[1]?.dcResistanceOhm).toBeCloseTo(0.02, 9);
    for (const r of results) {
      const expected = expectedEnduranceCycle(plan, r.cycle);
      expect(r.dischargeAh).toBeCloseTo(expected.dischargeAh, 9);
      expect(r.chargeAh).toBeCloseTo(expected.chargeAh, 9);
    }
  });

  it("keeps a glitch shorter than the shortest phase inside the phase, as segment() does", () => {
    const rows: [number, number, number][] = [];
    for (let t = 0; t <= 100; t++) rows.push([t, 4, t === 50 || t === 51 ? 0 : 1]);
    for (let t = 101; t <= 200; t++) rows.push([t, 3.5, -1]);
    for (let t = 201; t <= 210; t++) rows.push([t, 3.5, 0]);
    const [r] = feedAll(columnsOf(rows), []);
    // 100 s at 1 A, less the two rest samples' trapezoids: 100 − 2 (two intervals into and out of 0 A are half, two full at 0)…
    // by hand: intervals 49→50 and 51→52 carry 0.5 A·s each, 50→51 none, the other 97 carry 1 A·s: 98 A·s.
    expect(r?.chargeAh).toBeCloseTo(98 / 3600, 12);
    expect(r?.dischargeAh).toBeCloseTo(99 / 3600, 12);
  });

  it("refuses time that goes backwards across chunks and keeps its state", () => {
    const acc = createCycleAccumulator();
    if (!acc.ok) throw new Error(acc.error.message);
    expect(acc.value.push(columnsOf([[0, 4, 1], [1, 4, 1], [2, 4, 1]])).ok).toBe(true);
    const before = acc.value.saveState();
    const refused = acc.value.push(columnsOf([[3, 4, 1], [2.5, 4, 1]]));
    expect(refused.ok ? null : refused.error.code).toBe("time-not-increasing");
    expect(acc.value.saveState()).toEqual(before);
    // A part whose clock starts at zero continues the run's time line with an offset.
    expect(acc.value.push(columnsOf([[0, 4, 1]]), 3).ok).toBe(true);
    expect(acc.value.lastTimeS).toBe(3);
  });

  it("refuses a saved state it cannot read, in words", () => {
    const acc = createCycleAccumulator({}, { version: 99 } as never);
    expect(acc.ok ? null : acc.error.message).toMatch(/cannot be read/);
  });

  it("keeps a state of constant size however long the log", () => {
    const plan: EnduranceLogPlan = { ...enduranceLogPlan, cycles: 40 };
    const acc = createCycleAccumulator();
    if (!acc.ok) throw new Error(acc.error.message);
    const sizes: number[] = [];
    for (const chunk of generateEnduranceLog(plan, 20_000)) {
      acc.value.push(chunk);
      acc.value.takeResults();
      sizes.push(JSON.stringify(acc.value.saveState()).length);
    }
    expect(Math.max(...sizes)).toBeLessThan(2000);
  });
});
