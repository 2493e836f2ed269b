import type { LogColumns } from "@/lib/analysis";

// An invented endurance test of the 3 000 mAh cell (invented-cells.ts): cycle after cycle of CC charge,
// rest, CC discharge, rest, the capacity fading by a fixed share of rated per cycle. Voltages are straight
// lines within each phase, so the trapezoid rule is exact and every capacity and energy can be worked out
// by hand: Q = |I|·n·Δt, E = Q·(V_start + V_end)/2. Used by the tests, the demo and the benchmark.

export interface EnduranceLogPlan {
  ratedCapacityMAh: number;
  cycles: number;
  /** Charge and discharge currents as magnitudes, amperes. */
  chargeCurrentA: number;
  dischargeCurrentA: number;
  /** Sample interval, seconds. */
  sampleIntervalS: number;
  /** Rest after charge and after discharge, seconds (a whole number of intervals). */
  restS: number;
  /** Discharge capacity of cycle 1 as a share of rated. */
  firstShare: number;
  /** Share of rated lost per cycle (a straight-line fade). */
  fadePerCycle: number;
  /** A two-level DC resistance pulse at the start of every so many cycles' discharge (0: none). */
  pulseEveryCycles: number;
  /** The cell's series resistance for the pulse, ohms. */
  resistanceOhm: number;
  /** Charge ends here, voltages rise linearly from chargeFromV; discharge falls from dischargeFromV to dischargeToV. */
  chargeFromV: number;
  chargeToV: number;
  dischargeFromV: number;
  dischargeToV: number;
}

export const enduranceLogPlan: EnduranceLogPlan = {
  ratedCapacityMAh: 3000,
  cycles: 100,
  chargeCurrentA: 1.5,
  dischargeCurrentA: 1.5,
  sampleIntervalS: 1,
  restS: 600,
  firstShare: 0.98,
  fadePerCycle: 0.0003,
  pulseEveryCycles: 50,
  resistanceOhm: 0.02,
  chargeFromV: 3.6,
  chargeToV: 4.2,
  dischargeFromV: 4.05,
  dischargeToV: 2.75,
};

/** What cycle k of a plan should give, worked out from the plan (the answers a test checks against). */
export function expectedEnduranceCycle(plan: EnduranceLogPlan, k: number): { dischargeAh: number; chargeAh: number; intervals: { charge: number; discharge: number } } {
  const dt = plan.sampleIntervalS;
  const capacityAh = (plan.ratedCapacityMAh / 1000) * (plan.firstShare - plan.fadePerCycle * (k - 1));
  // Whole intervals, so the phases' integrals are exact: the discharge delivers |I|·n·Δt.
  const discharge = Math.round((capacityAh * 3600) / plan.dischargeCurrentA / dt);
  // The charge puts back what was taken out, plus 0.5 % (an invented coulombic loss).
  const charge = Math.round((capacityAh * 1.005 * 3600) / plan.chargeCurrentA / dt);
  // A pulse opens the discharge phase: 100 intervals of 0.1 s at I1, one of 0.1 s from I1 to I2, 9 at I2,
  // then one interval Δt from I2 to the discharge current (trapezoid).
  const rated = plan.ratedCapacityMAh / 1000;
  const [i1, i2, id] = [0.2 * rated, rated, plan.dischargeCurrentA];
  const pulseAs = hasPulse(plan, k) ? 10 * i1 + (0.1 * (i1 + i2)) / 2 + 0.9 * i2 + (dt * (i2 + id)) / 2 : 0;
  return { dischargeAh: (id * discharge * dt + pulseAs) / 3600, chargeAh: (plan.chargeCurrentA * charge * dt) / 3600, intervals: { charge, discharge } };
}

/** Number of samples the plan writes (for sizing a benchmark). */
export function countEnduranceSamples(plan: EnduranceLogPlan): number {
  let n = 0;
  for (let k = 1; k <= plan.cycles; k++) n += cycleSamples(plan, k);
  return n;
}

function cycleSamples(plan: EnduranceLogPlan, k: number): number {
  const { intervals } = expectedEnduranceCycle(plan, k);
  const rest = Math.round(plan.restS / plan.sampleIntervalS);
  return intervals.charge + 1 + rest + (hasPulse(plan, k) ? pulseSamples : 0) + intervals.discharge + 1 + rest;
}

const hasPulse = (plan: EnduranceLogPlan, k: number) => plan.pulseEveryCycles > 0 && k % plan.pulseEveryCycles === 0;
/** Base level 10 s then pulse 1 s, sampled every 0.1 s (IEC 61960-3 7.7 durations, docs/references.md §4). */
const pulseSamples = 101 + 10;

/**
 * The plan's samples in chunks of `chunkSamples` (time from 0 s, current positive while charging), generated
 * as they are asked for: a 10-million-sample log never sits in memory.
 */
export function* generateEnduranceLog(plan: EnduranceLogPlan, chunkSamples = 65_536): Generator<LogColumns> {
  let buf = newBuffer(chunkSamples);
  let n = 0;
  let t = 0;
  const dt = plan.sampleIntervalS;
  function* put(v: number, c: number, step: number): Generator<LogColumns> {
    buf.timeS[n] = t;
    buf.voltageV[n] = v;
    buf.currentA[n] = c;
    n++;
    t = Math.round((t + step) * 1000) / 1000;
    if (n === chunkSamples) {
      yield { ...buf, length: n };
      buf = newBuffer(chunkSamples);
      n = 0;
    }
  }
  const rest = Math.round(plan.restS / dt);
  const rated = plan.ratedCapacityMAh / 1000;
  for (let k = 1; k <= plan.cycles; k++) {
    const { intervals } = expectedEnduranceCycle(plan, k);
    for (let j = 0; j <= intervals.charge; j++) yield* put(plan.chargeFromV + ((plan.chargeToV - plan.chargeFromV) * j) / intervals.charge, plan.chargeCurrentA, dt);
    for (let j = 0; j < rest; j++) yield* put(plan.chargeToV - 0.05, 0, dt);
    if (hasPulse(plan, k)) {
      // 0.2 It for 10 s, then 1 It for 1 s: U2 = U1 − R·(I2 − I1).
      const i1 = 0.2 * rated;
      const i2 = 1 * rated;
      const u1 = plan.dischargeFromV + 0.05 - plan.resistanceOhm * i1;
      for (let j = 0; j <= 100; j++) yield* put(u1, -i1, 0.1);
      for (let j = 0; j < 10; j++) yield* put(u1 - plan.resistanceOhm * (i2 - i1), -i2, j === 9 ? dt : 0.1);
    }
    const from = plan.dischargeFromV;
    for (let j = 0; j <= intervals.discharge; j++) yield* put(from + ((plan.dischargeToV - from) * j) / intervals.discharge, -plan.dischargeCurrentA, dt);
    for (let j = 0; j < rest; j++) yield* put(plan.dischargeToV + 0.4, 0, dt);
  }
  if (n > 0) yield { timeS: buf.timeS.subarray(0, n), voltageV: buf.voltageV.subarray(0, n), currentA: buf.currentA.subarray(0, n), length: n };
}

function newBuffer(size: number): { timeS: Float64Array; voltageV: Float64Array; currentA: Float64Array } {
  return { timeS: new Float64Array(size), voltageV: new Float64Array(size), currentA: new Float64Array(size) };
}
