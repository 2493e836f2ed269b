import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { createOcvFunction, exampleOcvCurve, type CellModel, type OcvFunction } from "./cell-model";
import type { LogColumns } from "./log-columns";
import { createSeededRandom } from "./seeded-random";

interface StepSampling {
  /** Overrides the log's nominal sample interval for this step (a pulse is logged faster), seconds. */
  sampleIntervalS?: number;
}

/** Steps the generator can run. Currents are magnitudes in amperes; direction follows the kind. */
export type SyntheticStep = StepSampling &
  (
    | { kind: "charge"; currentA: number; voltageV: number; terminationCurrentA: number; maxDurationS?: number }
    | { kind: "discharge"; currentA: number; endVoltageV: number; maxDurationS?: number }
    | { kind: "rest"; durationS: number }
    /** Discharge at the base current, then at the higher pulse current (a DC resistance pulse). */
    | { kind: "pulse"; baseCurrentA: number; baseDurationS: number; pulseCurrentA: number; pulseDurationS: number }
  );

export interface SyntheticTemperature {
  ambientC: number;
  /** Slow drift of the ambient, °C per hour. */
  driftCPerHour?: number;
  /** Temperature rise per watt of I²R heat at steady state, °C/W. */
  heatingCPerW?: number;
  /** How fast the cell follows ambient and heating, seconds. */
  timeConstantS?: number;
}

/** Standard deviations of the measurement noise added to each logged value. */
export interface SyntheticNoise {
  voltageV: number;
  currentA: number;
  temperatureC: number;
}

export interface SyntheticLogOptions {
  cell: CellModel;
  steps: readonly SyntheticStep[];
  seed: number;
  /** Nominal sample interval, seconds. Default 1. */
  sampleIntervalS?: number;
  /** Each interval is the nominal one times 1 ± this fraction, uniformly. Default 0.2. */
  samplingJitter?: number;
  noise?: Partial<SyntheticNoise>;
  /** Adds a temperature column when given. */
  temperature?: SyntheticTemperature;
  /** Refuse to grow past this many samples. Default 5 000 000. */
  maxSamples?: number;
}

/** Where each programmed step landed in the log: the truth a segmentation should recover. */
export interface SyntheticStepSpan {
  stepIndex: number;
  kind: SyntheticStep["kind"];
  from: number;
  to: number;
}

export interface SyntheticLog {
  columns: LogColumns;
  steps: SyntheticStepSpan[];
}

const defaultNoise: SyntheticNoise = { voltageV: 0.0005, currentA: 0.0005, temperatureC: 0.05 };
const defaultMaxStepS = 86_400;

/**
 * Invents a cycler log from a simple cell model: terminal voltage = OCV(SoC) + R·I (I positive
 * charging), SoC counted from the current (definition of capacity). A charge runs CC until the
 * terminal voltage reaches the charge voltage, then CV with I = (V − OCV)/R until the current falls
 * to the termination current. Each logged sample holds until the next one. Deterministic for a seed.
 */
export function generateSyntheticLog(options: SyntheticLogOptions): AnalysisResult<SyntheticLog> {
  const problem = checkSyntheticLogOptions(options);
  if (problem) return fail("invalid-input", problem);
  const ocv = createOcvFunction(options.cell.ocvCurve ?? exampleOcvCurve);
  if (!ocv.ok) return ocv;

  const random = createSeededRandom(options.seed);
  const noise = { ...defaultNoise, ...options.noise };
  const withTemperature = options.temperature !== undefined;
  const log = createColumnBuilder(withTemperature);
  const maxSamples = options.maxSamples ?? 5_000_000;
  const state = createCellState(options, ocv.value);
  const spans: SyntheticStepSpan[] = [];

  const jitter = options.samplingJitter ?? 0.2;
  const decision = { currentA: 0, isLast: false };
  for (const [stepIndex, step] of options.steps.entries()) {
    const from = log.length();
    const interval = step.sampleIntervalS ?? options.sampleIntervalS ?? 1;
    const stepStartS = state.timeS;
    do {
      if (log.length() >= maxSamples) return fail("too-many-samples", `The log would exceed ${maxSamples} samples.`);
      decideCurrent(step, state, state.timeS - stepStartS, decision);
      const { currentA } = decision;
      log.push(
        state.timeS,
        state.ocvV + state.resistanceOhm * currentA + noise.voltageV * random.nextNormal(),
        currentA + noise.currentA * random.nextNormal(),
        state.temperatureC + (withTemperature ? noise.temperatureC * random.nextNormal() : 0),
        stepIndex + 1,
      );
      state.advance(currentA, interval * (1 + jitter * (2 * random.nextUniform() - 1)));
    } while (!decision.isLast);
    spans.push({ stepIndex, kind: step.kind, from, to: log.length() - 1 });
  }
  return succeed({ columns: log.finish(), steps: spans });
}

interface CellState {
  resistanceOhm: number;
  timeS: number;
  soc: number;
  /** OCV at the present SoC, volts (kept in step with soc). */
  ocvV: number;
  temperatureC: number;
  advance(currentA: number, dtS: number): void;
}

function createCellState(options: SyntheticLogOptions, ocv: OcvFunction): CellState {
  const { capacityMAh, seriesResistanceOhm, initialSoc } = options.cell;
  const thermal = options.temperature;
  const state: CellState = {
    resistanceOhm: seriesResistanceOhm,
    timeS: 0,
    soc: initialSoc,
    ocvV: ocv(initialSoc),
    temperatureC: thermal?.ambientC ?? Number.NaN,
    advance(currentA, dtS) {
      // mAh → A·s is × 3.6.
      state.soc += (currentA * dtS) / (3.6 * capacityMAh);
      state.ocvV = ocv(state.soc);
      state.timeS += dtS;
      if (thermal) {
        const heatW = currentA * currentA * seriesResistanceOhm;
        const target = thermal.ambientC + ((thermal.driftCPerHour ?? 0) * state.timeS) / 3600 + (thermal.heatingCPerW ?? 0) * heatW;
        state.temperatureC += (target - state.temperatureC) * (1 - Math.exp(-dtS / (thermal.timeConstantS ?? 600)));
      }
    },
  };
  return state;
}

/** Sets the current the cycler applies at this sample, and whether the step ends with it. */
function decideCurrent(
  step: SyntheticStep,
  state: CellState,
  elapsedS: number,
  decision: { currentA: number; isLast: boolean },
): void {
  switch (step.kind) {
    case "charge": {
      const cvCurrentA = (step.voltageV - state.ocvV) / state.resistanceOhm;
      decision.currentA = Math.max(0, Math.min(step.currentA, cvCurrentA));
      const onPlateau = cvCurrentA < step.currentA;
      decision.isLast = (onPlateau && decision.currentA <= step.terminationCurrentA) || elapsedS >= (step.maxDurationS ?? defaultMaxStepS);
      return;
    }
    case "discharge":
      decision.currentA = -step.currentA;
      decision.isLast =
        state.ocvV - state.resistanceOhm * step.currentA <= step.endVoltageV || elapsedS >= (step.maxDurationS ?? defaultMaxStepS);
      return;
    case "rest":
      decision.currentA = 0;
      decision.isLast = elapsedS >= step.durationS;
      return;
    case "pulse":
      decision.currentA = -(elapsedS < step.baseDurationS ? step.baseCurrentA : step.pulseCurrentA);
      decision.isLast = elapsedS >= step.baseDurationS + step.pulseDurationS;
      return;
    default: {
      const unknown: never = step;
      throw new Error(`Unknown step ${JSON.stringify(unknown)}`);
    }
  }
}

function checkSyntheticLogOptions(options: SyntheticLogOptions): string | null {
  const { cell, steps } = options;
  const isAbove0 = (x: number) => Number.isFinite(x) && x > 0;
  const positive = (x: number | undefined) => x === undefined || isAbove0(x);
  if (!isAbove0(cell.capacityMAh) || !isAbove0(cell.seriesResistanceOhm)) return "Capacity and series resistance must be above zero.";
  if (!(cell.initialSoc >= 0 && cell.initialSoc <= 1)) return "The initial state of charge must lie between 0 and 1.";
  if (!Number.isInteger(options.seed)) return "The seed must be a whole number.";
  if (!positive(options.sampleIntervalS)) return "The sample interval must be above zero.";
  const jitter = options.samplingJitter ?? 0.2;
  if (!(jitter >= 0 && jitter < 1)) return "The sampling jitter must lie in [0, 1).";
  if (steps.length === 0) return "Give at least one step.";
  for (const [k, step] of steps.entries()) {
    const ok = (() => {
      switch (step.kind) {
        case "charge":
          return [step.currentA, step.voltageV, step.terminationCurrentA].every(isAbove0) && step.terminationCurrentA < step.currentA && positive(step.maxDurationS);
        case "discharge":
          return isAbove0(step.currentA) && isAbove0(step.endVoltageV) && positive(step.maxDurationS);
        case "rest":
          return isAbove0(step.durationS);
        case "pulse":
          return [step.baseCurrentA, step.baseDurationS, step.pulseCurrentA, step.pulseDurationS].every(isAbove0);
        default: {
          const unknown: never = step;
          return Boolean(unknown);
        }
      }
    })();
    if (!ok || !positive(step.sampleIntervalS)) return `Step ${k + 1} (${step.kind}) has a missing, zero or negative value.`;
  }
  return null;
}

interface ColumnBuilder {
  length(): number;
  push(timeS: number, voltageV: number, currentA: number, temperatureC: number, step: number): void;
  finish(): LogColumns;
}

/** Columns that double when full and are trimmed to the filled length at the end. */
function createColumnBuilder(withTemperature: boolean): ColumnBuilder {
  let capacity = 1 << 16;
  let n = 0;
  let t = new Float64Array(capacity);
  let v = new Float64Array(capacity);
  let c = new Float64Array(capacity);
  let temperature = new Float64Array(withTemperature ? capacity : 0);
  let step = new Float64Array(capacity);
  const grow = (old: Float64Array<ArrayBuffer>): Float64Array<ArrayBuffer> => {
    if (old.length === 0) return old;
    const grown = new Float64Array(capacity);
    grown.set(old);
    return grown;
  };
  return {
    length: () => n,
    push(timeS, voltageV, currentA, temperatureC, stepNumber) {
      if (n === capacity) {
        capacity *= 2;
        [t, v, c, temperature, step] = [grow(t), grow(v), grow(c), grow(temperature), grow(step)];
      }
      t[n] = timeS;
      v[n] = voltageV;
      c[n] = currentA;
      if (withTemperature) temperature[n] = temperatureC;
      step[n] = stepNumber;
      n++;
    },
    finish: () => ({
      timeS: t.slice(0, n),
      voltageV: v.slice(0, n),
      currentA: c.slice(0, n),
      cyclerStep: step.slice(0, n),
      length: n,
      ...(withTemperature ? { temperatureC: temperature.slice(0, n) } : {}),
    }),
  };
}
