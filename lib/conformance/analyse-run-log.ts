import {
  computeStepResults,
  evaluateDcResistancePulse,
  matchSteps,
  segment,
  type LogColumns,
  type ExpectedStep,
  type Phase,
  type PhaseKind,
  type SegmentOptions,
  type StepResults,
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

/** One cycle of an endurance block as the log shows it: its charge and its discharge, when found. */
export interface LoggedCycle {
  cycle: number;
  charge: StepResults | null;
  discharge: StepResults | null;
}

/** The cycles of one cycle-block step found in the log, in order (cycles not reached are left out). */
export interface LoggedCycleBlock {
  stepId: string;
  cycles: LoggedCycle[];
}

export interface RunLogAnalysis {
  summary: RunLogSummary;
  /** One per planned step, in plan order. */
  evidence: LogEvidence[];
  /** The cycles of each cycle-block step; empty without a log or a block. */
  cycleBlocks: LoggedCycleBlock[];
}

/** The phases one cycle of a block leaves in the log, in order. */
const CYCLE_PARTS = ["charge", "rest", "discharge", "rest"] as const;

interface ExpectedEntry {
  /** The planned step this entry belongs to. */
  planIndex: number;
  expected: ExpectedStep;
  /** One of a cycle block's phase entries. */
  inBlock: boolean;
}

/**
 * The steps the log is matched against: each planned step once, except a cycle block, which expects
 * the four phases of each of its cycles, all optional (the run may stop, or not yet have reached them).
 */
function listExpected(planned: readonly PlannedStep[]): ExpectedEntry[] {
  const entries: ExpectedEntry[] = [];
  planned.forEach((entry, planIndex) => {
    const { step } = entry;
    if (step.kind !== "cycle-block") {
      entries.push({ planIndex, expected: { id: `${step.id}#${entry.cycle}`, kind: step.kind }, inBlock: false });
      return;
    }
    for (let cycle = 1; cycle <= step.maxCycles; cycle++) {
      CYCLE_PARTS.forEach((kind, part) =>
        entries.push({ planIndex, expected: { id: `${step.id}#${entry.cycle}/${cycle}.${part}`, kind, optional: true }, inBlock: true }),
      );
    }
  });
  return entries;
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
    return { summary: { status: "no log", reason }, evidence: everyStep({ kind: "no log", reason }), cycleBlocks: [] };
  }
  const settings = readSegmentSettings(options.segment);
  const phases = segment(log, settings);
  if (!phases.ok) {
    const reason = `the data log cannot be read: ${phases.error.message}`;
    return { summary: { status: "unusable", reason }, evidence: everyStep({ kind: "no log", reason }), cycleBlocks: [] };
  }
  const entries = listExpected(planned);
  const matching = matchSteps(
    entries.map((entry) => entry.expected),
    phases.value,
  );
  if (!matching.ok) {
    const reason = `the data log cannot be matched to the steps: ${matching.error.message}`;
    return { summary: { status: "unusable", reason }, evidence: everyStep({ kind: "no log", reason }), cycleBlocks: [] };
  }
  // Per planned step: its matched phase, or for a block the phases of its cycles.
  const phaseOfPlanned = new Map<number, number | null>();
  const blockParts = new Map<number, { phaseIndex: number }[]>();
  entries.forEach((entry, k) => {
    const phaseIndex = matching.value.steps[k]?.phaseIndex ?? null;
    if (!entry.inBlock) {
      phaseOfPlanned.set(entry.planIndex, phaseIndex);
    } else if (phaseIndex !== null) {
      const parts = blockParts.get(entry.planIndex) ?? [];
      parts.push({ phaseIndex });
      blockParts.set(entry.planIndex, parts);
    }
  });
  const cycleBlocks: LoggedCycleBlock[] = [];
  const pulseOptions = { minLevelSamples: settings.minPhaseSamples ?? 3, ...settings.pulse };
  const evidence = planned.map((entry, k): LogEvidence => {
    if (entry.step.kind === "cycle-block") {
      const parts = blockParts.get(k) ?? [];
      cycleBlocks.push({ stepId: entry.step.id, cycles: collectCycles(log, phases.value, parts) });
      return describeBlockEvidence(log, phases.value, parts);
    }
    const phaseIndex = phaseOfPlanned.get(k) ?? null;
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
    cycleBlocks,
  };
}

function resultsOf(log: LogColumns, phase: Phase | undefined): StepResults | null {
  if (phase === undefined) return null;
  const results = computeStepResults(log, phase);
  return results.ok ? results.value : null;
}

/**
 * The cycles of a block that reached the log, numbered in log order: each charge starts a cycle, and a
 * discharge belongs to the cycle its charge started (a discharge with no charge before it in the cycle
 * starts one of its own). The alignment may put the phases on any of the block's equal cycle entries, so
 * the numbering is taken from the phases' order, never from the entries.
 */
function collectCycles(log: LogColumns, phases: readonly Phase[], parts: readonly { phaseIndex: number }[]): LoggedCycle[] {
  const cycles: LoggedCycle[] = [];
  const ordered = [...parts].sort((a, b) => a.phaseIndex - b.phaseIndex);
  for (const { phaseIndex } of ordered) {
    const phase = phases[phaseIndex];
    if (phase === undefined || phase.kind === "rest") continue;
    const last = cycles[cycles.length - 1];
    const startsCycle = phase.kind === "charge" || last === undefined || last.discharge !== null;
    const entry = startsCycle ? { cycle: cycles.length + 1, charge: null, discharge: null } : last;
    entry[phase.kind] = resultsOf(log, phase);
    if (startsCycle) cycles.push(entry);
  }
  return cycles;
}

/** The block as one step: the span from its first to its last matched phase. */
function describeBlockEvidence(log: LogColumns, phases: readonly Phase[], parts: readonly { phaseIndex: number }[]): LogEvidence {
  const indexes = parts.map((part) => part.phaseIndex);
  if (indexes.length === 0) return { kind: "not found", reason: "the data log shows no cycle of this block where the step order puts it" };
  const first = phases[Math.min(...indexes)] as Phase;
  const last = phases[Math.max(...indexes)] as Phase;
  const span: Phase = { kind: "rest", from: first.from, to: last.to, startS: first.startS, endS: last.endS };
  const results = computeStepResults(log, span);
  if (!results.ok) return { kind: "not found", reason: `the block's span of the log cannot be evaluated: ${results.error.message}` };
  return { kind: "found", columns: log, phase: span, phaseIndex: Math.min(...indexes), results: results.value, dcResistance: null };
}
