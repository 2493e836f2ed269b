import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { checkLogColumns } from "./check-log-columns";
import { checkIndexRange, type IndexRange } from "./index-range";
import type { LogColumns } from "./log-columns";

const blockSamples = 4096;

export interface Integral {
  /** Q = ∫|I| dt, ampere-hours. */
  capacityAh: number;
  /** E = ∫V·|I| dt, watt-hours. */
  energyWh: number;
  /** E / Q, volts; null when no charge moved (Q = 0). */
  meanVoltageV: number | null;
  /** Time from the first to the last sample of the range, seconds. */
  durationS: number;
}

/**
 * Capacity and energy over the inclusive sample range [from, to], trapezoid rule (definition,
 * docs/design.md §6): Q = Σ Δt·(|I₀| + |I₁|)/2, E = Σ Δt·(V₀|I₀| + V₁|I₁|)/2.
 * Terms are summed plainly within blocks and the block sums are added with Neumaier compensation,
 * so 2 million small terms lose no digits and splitting a range at a shared sample gives the same
 * total to rounding, at the speed of a plain loop.
 */
export function integrate(columns: LogColumns, range: IndexRange): AnalysisResult<Integral> {
  const problem = checkLogColumns(columns) ?? checkIndexRange(range, columns.length);
  if (problem) return { ok: false, error: problem };
  const { timeS: t, voltageV: v, currentA: c } = columns;
  const { from, to } = range;

  const total = { q: 0, qCarry: 0, e: 0, eCarry: 0 };
  let tPrev = t[from] as number;
  if (!Number.isFinite(tPrev)) return fail("non-finite-value", `Time at sample ${from} is not a number.`);
  let aPrev = Math.abs(c[from] as number);
  let pPrev = (v[from] as number) * aPrev;
  for (let blockFrom = from + 1; blockFrom <= to; blockFrom += blockSamples) {
    const blockTo = Math.min(blockFrom + blockSamples - 1, to);
    let q = 0;
    let e = 0;
    for (let i = blockFrom; i <= blockTo; i++) {
      const ti = t[i] as number;
      const dt = ti - tPrev;
      if (!(dt > 0)) return fail("time-not-increasing", `Time does not increase at sample ${i} (${tPrev} s → ${ti} s).`);
      const a = Math.abs(c[i] as number);
      const p = (v[i] as number) * a;
      q += dt * (aPrev + a);
      e += dt * (pPrev + p);
      tPrev = ti;
      aPrev = a;
      pPrev = p;
    }
    addCompensated(total, q, e);
  }
  // Halve for the trapezoid, then A·s → Ah and W·s → Wh.
  const capacityAh = (total.q + total.qCarry) / 7200;
  const energyWh = (total.e + total.eCarry) / 7200;
  if (!Number.isFinite(capacityAh) || !Number.isFinite(energyWh)) {
    return fail("non-finite-value", `A voltage or current between samples ${from} and ${to} is not a number.`);
  }
  return succeed({
    capacityAh,
    energyWh,
    meanVoltageV: capacityAh > 0 ? energyWh / capacityAh : null,
    durationS: tPrev - (t[from] as number),
  });
}

function addCompensated(total: { q: number; qCarry: number; e: number; eCarry: number }, q: number, e: number): void {
  const qNext = total.q + q;
  total.qCarry += Math.abs(total.q) >= Math.abs(q) ? total.q - qNext + q : q - qNext + total.q;
  total.q = qNext;
  const eNext = total.e + e;
  total.eCarry += Math.abs(total.e) >= Math.abs(e) ? total.e - eNext + e : e - eNext + total.e;
  total.e = eNext;
}
