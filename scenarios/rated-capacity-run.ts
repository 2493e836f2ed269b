import { generateSyntheticLog, type CellModel, type SyntheticLog, type SyntheticStep } from "@/lib/analysis";
import { readCellRating, type ProgrammedSetPoints, type RunEvaluationInput, type StepRecordInput } from "@/lib/conformance";
import {
  ratedCapacityAt20cTemplate,
  resolveProcedure,
  type CellSpecification,
  type Procedure,
  type ProcedureResolution,
  type ResolvedStep,
} from "@/protocols";
import { inventedCell } from "./invented-cells";

export { inventedCell };

export const logStartedAt = "2026-03-02T08:00:00.000Z";
const logStartMs = Date.parse(logStartedAt);

/** An ISO time `seconds` after the log started. */
export function atLogSecond(seconds: number): string {
  return new Date(logStartMs + Math.round(seconds * 1000)).toISOString();
}

export function resolveOrThrow(input: { procedure?: Procedure; cell?: CellSpecification; acknowledgedCautions?: string[] }): ProcedureResolution {
  const result = resolveProcedure({
    procedure: input.procedure ?? ratedCapacityAt20cTemplate,
    cellSpecification: input.cell ?? inventedCell,
    ...(input.acknowledgedCautions && { acknowledgedCautions: input.acknowledgedCautions }),
  });
  if (!result.ok) throw new Error(`the procedure must resolve: ${JSON.stringify(result)}`);
  return result.resolution;
}

function valueOf(setPoint: { value: number } | null, what: string): number {
  if (setPoint === null) throw new Error(`${what} did not resolve`);
  return setPoint.value;
}

/** The programmed set-points an operator would enter for a resolved step. */
export function programmedFor(step: ResolvedStep, restS: number): ProgrammedSetPoints {
  switch (step.kind) {
    case "charge":
      return {
        current: valueOf(step.current, "charge current"),
        voltage: valueOf(step.voltage, "charge voltage"),
        ...(step.termination.kind === "current"
          ? { terminationCurrent: valueOf(step.termination.current, "termination current") }
          : { terminationDuration: step.termination.duration.value }),
      };
    case "discharge":
      return { current: valueOf(step.current, "discharge current"), endVoltage: valueOf(step.endVoltage, "end voltage") };
    case "rest":
      return { duration: restS };
    default:
      throw new Error(`no programmed values for a ${step.kind} step in these fixtures`);
  }
}

export interface RunScenario {
  /** The cell the procedure is resolved on and whose rating applies; the invented cell by default. */
  cell?: CellSpecification;
  resolution?: ProcedureResolution;
  cellModel?: Partial<CellModel>;
  /** The rest the operator ran, s. */
  restS?: number;
  cycles?: number;
  /** The operator stopped the measured discharge after this many seconds. */
  stopDischargeAfterS?: number;
  /** Seconds between log samples; 5 s by default (the benchmark samples faster for a 2 M-row log). */
  sampleIntervalS?: number;
  /** Ambient readings for a step of a cycle, °C; 22.5 °C at start and end by default. */
  ambient?: (stepId: string, cycle: number) => number[];
}

export interface BuiltRun {
  input: RunEvaluationInput;
  log: SyntheticLog;
  resolution: ProcedureResolution;
}

/**
 * A rated-capacity run as a lab would record it: a synthetic log that follows the resolved steps
 * (precondition, then charge–rest–discharge once per cycle) and a record per step whose times are
 * the log's, with the resolved set-points programmed.
 */
export function buildRatedCapacityRun(scenario: RunScenario = {}): BuiltRun {
  const cell = scenario.cell ?? inventedCell;
  const resolution = scenario.resolution ?? resolveOrThrow({ cell });
  const restS = scenario.restS ?? 7200;
  const cycles = scenario.cycles ?? 1;
  const byId = new Map(resolution.steps.map((step) => [step.id, step]));
  const stepOf = (id: string) => {
    const step = byId.get(id);
    if (!step) throw new Error(`no step ${id}`);
    return step;
  };
  const planned: { step: ResolvedStep; cycle: number }[] = [{ step: stepOf("precondition"), cycle: 1 }];
  for (let cycle = 1; cycle <= cycles; cycle++) for (const id of ["charge", "rest", "discharge"]) planned.push({ step: stepOf(id), cycle });

  const synthetic = planned.map(({ step }): SyntheticStep => {
    const programmed = programmedFor(step, restS);
    switch (step.kind) {
      case "charge":
        return { kind: "charge", currentA: programmed.current ?? 0, voltageV: programmed.voltage ?? 0, terminationCurrentA: programmed.terminationCurrent ?? 0 };
      case "discharge":
        return {
          kind: "discharge",
          currentA: programmed.current ?? 0,
          endVoltageV: programmed.endVoltage ?? 0,
          ...(step.id === "discharge" && scenario.stopDischargeAfterS !== undefined && { maxDurationS: scenario.stopDischargeAfterS }),
        };
      case "rest":
        return { kind: "rest", durationS: restS };
      default:
        throw new Error(`no synthetic ${step.kind} step in these fixtures`);
    }
  });
  const generated = generateSyntheticLog({
    cell: { capacityMAh: 3150, seriesResistanceOhm: 0.03, initialSoc: 0.5, ...scenario.cellModel },
    steps: synthetic,
    seed: 61960,
    sampleIntervalS: scenario.sampleIntervalS ?? 5,
    maxSamples: 10_000_000,
    noise: { voltageV: 0.0005, currentA: 0.0002 },
    temperature: { ambientC: 22.5, heatingCPerW: 2 },
  });
  if (!generated.ok) throw new Error(generated.error.message);
  const log = generated.value;
  const t = log.columns.timeS;

  const stepRecords = planned.map(({ step, cycle }, k): StepRecordInput => {
    const span = log.steps[k];
    if (!span) throw new Error(`no span for step ${k}`);
    const startS = t[span.from] as number;
    const endS = t[span.to] as number;
    const readings = scenario.ambient?.(step.id, cycle) ?? [22.5, 22.5];
    return {
      stepId: step.id,
      cycle,
      startedAt: atLogSecond(startS),
      endedAt: atLogSecond(endS),
      ambientReadings: readings.map((celsius, r) => ({
        at: atLogSecond(startS + ((endS - startS) * r) / Math.max(1, readings.length - 1)),
        celsius,
        instrumentId: "TH-07",
      })),
      programmed: programmedFor(step, restS),
      completed: true,
    };
  });
  return {
    resolution,
    log,
    input: {
      resolution,
      cellRating: readCellRating(cell),
      stepRecords,
      log: log.columns,
      logStartedAt,
      procedureSource: { standard: ratedCapacityAt20cTemplate.header.standard, clause: ratedCapacityAt20cTemplate.header.clause },
    },
  };
}
