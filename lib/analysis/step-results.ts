import { succeed, type AnalysisResult } from "./analysis-result";
import type { IndexRange } from "./index-range";
import { integrate } from "./integrate";
import type { LogColumns } from "./log-columns";
import type { Phase, PhaseKind } from "./segment";

export interface CurrentStatistics {
  /** Mean of |I| over the samples, amperes (per sample, not time-weighted). */
  meanA: number;
  /** Sample standard deviation of |I| (n − 1 in the denominator), amperes; 0 for one sample. */
  standardDeviationA: number;
  samples: number;
}

export interface StepResults extends IndexRange {
  kind: PhaseKind;
  startS: number;
  endS: number;
  durationS: number;
  capacityAh: number;
  capacityMAh: number;
  energyWh: number;
  meanVoltageV: number | null;
  startVoltageV: number;
  endVoltageV: number;
  minVoltageV: number;
  maxVoltageV: number;
  /** Current over the constant-current part: a charge's CC part, a whole single-level discharge; null otherwise. */
  constantCurrent: CurrentStatistics | null;
  /** |I| at the last sample of a charge's CV part, amperes; null without a CV part. */
  cvTerminationCurrentA: number | null;
  /** Highest temperature over the phase, °C; null when the log has none. */
  maxTemperatureC: number | null;
}

/** The results of one phase (or of any span shaped like one): integrals, voltages, CC current, CV end, temperature. */
export function computeStepResults(columns: LogColumns, phase: Phase): AnalysisResult<StepResults> {
  const integral = integrate(columns, phase);
  if (!integral.ok) return integral;
  const { from, to } = phase;
  const v = columns.voltageV;
  let minVoltageV = Infinity;
  let maxVoltageV = -Infinity;
  for (let i = from; i <= to; i++) {
    const x = v[i] as number;
    if (x < minVoltageV) minVoltageV = x;
    if (x > maxVoltageV) maxVoltageV = x;
  }
  const { capacityAh, energyWh, meanVoltageV, durationS } = integral.value;
  return succeed({
    kind: phase.kind,
    from,
    to,
    startS: columns.timeS[from] as number,
    endS: columns.timeS[to] as number,
    durationS,
    capacityAh,
    capacityMAh: capacityAh * 1000,
    energyWh,
    meanVoltageV,
    startVoltageV: v[from] as number,
    endVoltageV: v[to] as number,
    minVoltageV,
    maxVoltageV,
    constantCurrent: summariseConstantCurrent(columns, phase),
    cvTerminationCurrentA:
      phase.kind === "charge" && phase.constantVoltage ? Math.abs(columns.currentA[phase.constantVoltage.to] as number) : null,
    maxTemperatureC: findMaxTemperature(columns, phase),
  });
}

function summariseConstantCurrent(columns: LogColumns, phase: Phase): CurrentStatistics | null {
  switch (phase.kind) {
    case "rest":
      return null;
    case "charge":
      return phase.constantCurrent ? computeCurrentStatistics(columns, phase.constantCurrent) : null;
    case "discharge":
      return phase.pulse ? null : computeCurrentStatistics(columns, phase);
    default: {
      const unknown: never = phase;
      throw new Error(`Unknown phase ${JSON.stringify(unknown)}`);
    }
  }
}

/** Mean and sample standard deviation of |I| in one pass (Welford's update). */
function computeCurrentStatistics(columns: LogColumns, range: IndexRange): CurrentStatistics {
  const c = columns.currentA;
  let mean = 0;
  let m2 = 0;
  let samples = 0;
  for (let i = range.from; i <= range.to; i++) {
    const x = Math.abs(c[i] as number);
    samples++;
    const delta = x - mean;
    mean += delta / samples;
    m2 += delta * (x - mean);
  }
  return { meanA: mean, standardDeviationA: samples > 1 ? Math.sqrt(m2 / (samples - 1)) : 0, samples };
}

function findMaxTemperature(columns: LogColumns, range: IndexRange): number | null {
  const temperature = columns.temperatureC;
  if (!temperature) return null;
  let max = -Infinity;
  for (let i = range.from; i <= range.to; i++) {
    const x = temperature[i] as number;
    if (x > max) max = x;
  }
  return max === -Infinity ? null : max;
}
