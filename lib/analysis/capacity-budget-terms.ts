import { combineBudget, createBudgetRow, type Tolerance, type UncertaintyBudget, type UncertaintyBudgetRow } from "./uncertainty";

/** The terms of a capacity budget beyond the current and time limits of the channel. */
export interface CapacityBudgetTerms {
  /** Where the discharge stops: the voltage channel's limit at the end voltage, through |dQ/dV| there. */
  endVoltage?: { source: string; tolerance: Tolerance; statedLimit?: string; endVoltageV: number; slopeAhPerV: number };
  /** The log's current resolution δ, A: rectangular, half-width δ / 2 (GUM F.2.2.1). */
  currentResolutionA?: { value: number; currentA: number };
  /** The log's time resolution δ, s: the two ends of the step each read to δ / 2, half-width δ in all (GUM F.2.2.1). */
  timeResolutionS?: { value: number; durationS: number };
  /** Capacities of the same step over repeated cycles: their experimental standard deviation s(q_k) (GUM 4.2.2), Type A. */
  repeatedCycles?: { capacitiesAh: readonly number[] };
}

/** Sample standard deviation (n − 1), GUM 4.2.2. */
export function computeExperimentalStandardDeviation(values: readonly number[]): number {
  const n = values.length;
  const mean = values.reduce((a, b) => a + b, 0) / n;
  return Math.sqrt(values.reduce((sum, x) => sum + (x - mean) ** 2, 0) / (n - 1));
}

/**
 * Adds to a capacity budget Q = I·t the terms the product model leaves out, each as its relative
 * contribution to u(Q)/Q, combined in quadrature with the others (GUM 5.1.2):
 * - the end of the discharge: the voltage channel's error e at the end voltage moves the point where
 *   the discharge stops, so Q moves by (dQ/dV)·e; relative sensitivity (dQ/dV)·V_end / Q (GUM 5.1.3);
 * - the log's resolution of current and time (GUM F.2.2.1: a reading to δ lies within ±δ/2);
 * - a Type A term from repeated cycles of the step: s(q_k) of their capacities, as the repeatability
 *   of one cycle's value (GUM 4.2.2; the result judged is one cycle's, not the mean, so not s/√n).
 */
export function extendCapacityBudget(budget: UncertaintyBudget, terms: CapacityBudgetTerms): UncertaintyBudget {
  const q = budget.value;
  const rows: UncertaintyBudgetRow[] = [...budget.rows];
  const { endVoltage, currentResolutionA, timeResolutionS, repeatedCycles } = terms;
  if (endVoltage && endVoltage.slopeAhPerV > 0 && endVoltage.endVoltageV > 0) {
    rows.push(
      createBudgetRow({
        quantity: "end voltage",
        source: `${endVoltage.source}, moving where the discharge stops (|dQ/dV| = ${endVoltage.slopeAhPerV.toPrecision(3)} Ah/V at the end of the log)`,
        tolerance: endVoltage.tolerance,
        ...(endVoltage.statedLimit !== undefined && { statedLimit: endVoltage.statedLimit }),
        reading: endVoltage.endVoltageV,
        unit: "V",
        sensitivity: (endVoltage.slopeAhPerV * endVoltage.endVoltageV) / q,
      }),
    );
  }
  if (currentResolutionA && currentResolutionA.value > 0) {
    rows.push(
      createBudgetRow({
        quantity: "current",
        source: "resolution of the log's current column",
        tolerance: { form: "absolute", halfWidth: currentResolutionA.value / 2 },
        statedLimit: `±half of ${currentResolutionA.value} A`,
        reading: currentResolutionA.currentA,
        unit: "A",
        sensitivity: 1,
      }),
    );
  }
  if (timeResolutionS && timeResolutionS.value > 0) {
    rows.push(
      createBudgetRow({
        quantity: "time",
        source: "resolution of the log's time column, at both ends of the step",
        tolerance: { form: "absolute", halfWidth: timeResolutionS.value },
        statedLimit: `±${timeResolutionS.value} s (±half of ${timeResolutionS.value} s at each end)`,
        reading: timeResolutionS.durationS,
        unit: "s",
        sensitivity: 1,
      }),
    );
  }
  if (repeatedCycles && repeatedCycles.capacitiesAh.length >= 2) {
    const s = computeExperimentalStandardDeviation(repeatedCycles.capacitiesAh);
    rows.push(
      createBudgetRow({
        quantity: "capacity",
        source: `repeatability over ${repeatedCycles.capacitiesAh.length} cycles of the step (Type A, s of one cycle's value)`,
        tolerance: { form: "absolute", halfWidth: s },
        distribution: { kind: "normal", coverageFactor: 1 },
        statedLimit: `s = ${s.toPrecision(3)} Ah`,
        reading: q,
        unit: "Ah",
        sensitivity: 1,
      }),
    );
  }
  return combineBudget({ measurand: budget.measurand, value: q, unit: budget.unit, rows, coverageFactor: budget.coverageFactor });
}
