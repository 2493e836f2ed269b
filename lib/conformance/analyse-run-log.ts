import {
  computeStepResults,
  evaluateDcResistancePulse,
  matchSteps,
  segment,
  type LogColumns,
  type Phase,
  type PhaseKind,
  type SegmentOptions,
} from "@/lib/analysis";
import type { PlannedStep } from "./plan-run-sequence";
import type { EvaluationOptions } from "./run-evaluation-input";
import type { LogEvidence } from "./step-context";

/** A phase of the log as the evaluation reports it. */
export interface LogPhaseSummary {
  index: number;
  kind: PhaseKind;
  from: number;
  to: number;
  startS: number;
  endS: number;
}

/** What became of the log as a whole. */
export type RunLogSummary =
  | { status: "no log"; reason: string }
  | { status: "unusable"; reason: string }
  | { status: "analysed"; samples: number; phases: LogPhaseSummary[]; extraPhaseIndexes: number[] };

export interface RunLogAnalysis {
  summary: RunLogSummary;
  /** One per planned step, in plan order. */
  evidence: LogEvidence[];
}

function summarisePhase(phase: Phase, index: number): LogPhaseSummary {
  return { index, kind: phase.kind, from: phase.from, to: phase.to, startS: phase.startS, endS: phase.endS };
}

function readSegmentSettings(options: EvaluationOptions["segment"]): Partial<SegmentOptions> {
  if (options === undefined) return {};
  const { pulse, ...rest } = options;
  return { ...rest, ...(pulse !== undefined && { pulse }) };
}

/**
 * Cuts the log into phases (lib/analysis segment), matches them to the planned steps in order
 * (matchSteps) and computes each matched step's results; a pulse step also gets its two levels and
 * Rdc. A missing or unreadable log gives every step the reason, never an exception.
 */
export function analyseRunLog({
  log,
  planned,
  options,
}: {
  log: LogColumns | undefined;
  planned: readonly PlannedStep[];
  options: EvaluationOptions;
}): RunLogAnalysis {
  const everyStep = (evidence: LogEvidence) => planned.map(() => evidence);
  if (log === undefined) {
    const reason = "no data log was uploaded";
    return { summary: { status: "no log", reason }, evidence: everyStep({ kind: "no log", reason }) };
  }
  const settings = readSegmentSettings(options.segment);
  const phases = segment(log, settings);
  if (!phases.ok) {
    const reason = `the data log cannot be read: ${phases.error.message}`;
    return { summary: { status: "unusable", reason }, evidence: everyStep({ kind: "no log", reason }) };
  }
  const expected = planned.map((entry) => ({ id: `${entry.step.id}#${entry.cycle}`, kind: entry.step.kind }));
  const matching = matchSteps(expected, phases.value);
  if (!matching.ok) {
    const reason = `the data log cannot be matched to the steps: ${matching.error.message}`;
    return { summary: { status: "unusable", reason }, evidence: everyStep({ kind: "no log", reason }) };
  }
  const pulseOptions = { minLevelSamples: settings.minPhaseSamples ?? 3, ...settings.pulse };
  const evidence = planned.map((entry, k): LogEvidence => {
    const phaseIndex = matching.value.steps[k]?.phaseIndex ?? null;
    const phase = phaseIndex === null ? undefined : phases.value[phaseIndex];
    if (phaseIndex === null || phase === undefined) {
      return { kind: "not found", reason: `the data log shows no phase for this step where the step order puts it` };
    }
    const results = computeStepResults(log, phase);
    if (!results.ok) return { kind: "not found", reason: `the matched log phase cannot be evaluated: ${results.error.message}` };
    const pulse = entry.step.kind === "pulse" ? evaluateDcResistancePulse(log, phase, pulseOptions) : null;
    return {
      kind: "found",
      columns: log,
      phase,
      phaseIndex,
      results: results.value,
      dcResistance: pulse !== null && pulse.ok ? pulse.value : null,
    };
  });
  return {
    summary: {
      status: "analysed",
      samples: log.length,
      phases: phases.value.map(summarisePhase),
      extraPhaseIndexes: matching.value.extraPhaseIndexes,
    },
    evidence,
  };
}
