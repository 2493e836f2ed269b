import { generateSyntheticLog, type CellModel, type LogColumns, type SyntheticStep } from "../lib/analysis";
import type { ProgrammedSetPoints, StepRecordInput } from "../lib/conformance";
import type { ProcedureResolution, ResolvedStep } from "../protocols";
import { programmedFor } from "../scenarios/rated-capacity-run";

/** How one invented run went: the cell, when it started, and what the operator did differently. */
export interface DemoRunPlan {
  resolution: ProcedureResolution;
  cellModel: CellModel;
  /** Noise seed of the log. */
  seed: number;
  /** When the first step started (ISO, with zone). */
  startedAt: string;
  /** Seconds between log samples. */
  sampleIntervalS: number;
  /** The rest the operator ran, s, for each rest step (at least its minimum). */
  restS: (step: ResolvedStep) => number;
  /** Set-points the operator programmed other than the resolved ones, by step id. */
  programmed?: Record<string, Partial<ProgrammedSetPoints>>;
  /** Caution codes the operator acknowledged, by step id. */
  acknowledged?: Record<string, string[]>;
  /** Ambient recorded at each step's start and end, °C. */
  ambientC: number;
  /** The instrument the ambient readings came from. */
  ambientInstrument: string;
}

export interface DemoRunLog {
  stepRecords: StepRecordInput[];
  columns: LogColumns;
}

function toSyntheticStep(step: ResolvedStep, programmed: ProgrammedSetPoints, restS: number): SyntheticStep {
  switch (step.kind) {
    case "charge":
      return { kind: "charge", currentA: programmed.current ?? 0, voltageV: programmed.voltage ?? 0, terminationCurrentA: programmed.terminationCurrent ?? 0 };
    case "discharge":
      return { kind: "discharge", currentA: programmed.current ?? 0, endVoltageV: programmed.endVoltage ?? 0 };
    case "rest":
      return { kind: "rest", durationS: restS };
    default:
      throw new Error(`the demo runs have no ${step.kind} step`);
  }
}

/**
 * An invented cycler log and the operator's step records for a procedure made only of charge, rest
 * and discharge steps, run once each in order (a repeat block's first cycle): the same simple cell
 * model as scenarios/rated-capacity-run.ts, with the times of the records taken from the log.
 */
export function buildDemoRunLog(plan: DemoRunPlan): DemoRunLog {
  const steps = plan.resolution.steps;
  const programmed = steps.map((step) => ({ ...programmedFor(step, plan.restS(step)), ...plan.programmed?.[step.id] }));
  const generated = generateSyntheticLog({
    cell: plan.cellModel,
    steps: steps.map((step, k) => toSyntheticStep(step, programmed[k]!, plan.restS(step))),
    seed: plan.seed,
    sampleIntervalS: plan.sampleIntervalS,
    noise: { voltageV: 0.0005, currentA: 0.0002 },
    temperature: { ambientC: plan.ambientC, heatingCPerW: 2 },
  });
  if (!generated.ok) throw new Error(generated.error.message);
  const { columns, steps: spans } = generated.value;
  const startMs = Date.parse(plan.startedAt);
  const at = (s: number) => new Date(startMs + Math.round(s * 1000)).toISOString();
  const stepRecords = steps.map((step, k): StepRecordInput => {
    const span = spans[k]!;
    const startS = columns.timeS[span.from] as number;
    const endS = columns.timeS[span.to] as number;
    return {
      stepId: step.id,
      cycle: 1,
      startedAt: at(startS),
      endedAt: at(endS),
      ambientReadings: [startS, endS].map((s) => ({ at: at(s), celsius: plan.ambientC, instrumentId: plan.ambientInstrument })),
      programmed: programmed[k]!,
      completed: true,
      acknowledgedCautionCodes: plan.acknowledged?.[step.id] ?? [],
    };
  });
  return { stepRecords, columns };
}
