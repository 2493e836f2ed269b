import { describeDischargeEnd, type DcResistancePulse, type StepResults } from "@/lib/analysis";
import { needsDataLog, readDecisionRule, type DecisionRule, type FieldProblem, type ProcedureResolution, type ResolvedStep } from "@/protocols";
import { analyseRunLog, type LogPhaseSummary, type RunLogSummary } from "./analyse-run-log";
import { checkAmbient } from "./check-ambient";
import { checkCautionsAcknowledged } from "./check-cautions-acknowledged";
import { checkChargeVoltage } from "./check-charge-voltage";
import { checkCurrentHold } from "./check-current-hold";
import { checkDurations } from "./check-durations";
import { checkEndCondition } from "./check-end-condition";
import { checkInstrumentTolerances } from "./check-instrument-tolerances";
import { checkLogPhaseFound, checkRecordMatchesLog, checkUnexplainedLogPhases } from "./check-log-agreement";
import { checkOrderAndGap, checkStepRecorded, type PlacedStep } from "./check-order-and-gaps";
import { checkPulseTiming } from "./check-pulse-timing";
import { checkRating } from "./check-rating";
import { checkRestWindow } from "./check-rest-window";
import { checkSetPoints } from "./check-set-points";
import { decideVerdict, type CriterionConformity, type RunVerdict } from "./decide-verdict";
import { evaluateAcceptance, type AcceptanceResult } from "./evaluate-acceptance";
import { evaluateRepeatRule, type RepeatOutcome } from "./evaluate-repeat-rule";
import { evaluateObservations, toObservationConformity, type ObservationsResult } from "./evaluate-observations";
import { evaluateEndurance, toEnduranceConformity, type EnduranceResult } from "./evaluate-endurance";
import { evaluateChargeRetention, type ChargeRetentionResult } from "./evaluate-retention";
import {
  evaluateStepUncertainties,
  findCriterionUncertainty,
  type StepUncertainty,
  type UncertaintyNotEvaluated,
} from "./evaluate-uncertainty";
import { createRunFinding, type Finding } from "./finding";
import { citeProcedure } from "./format-value";
import { planRunSequence } from "./plan-run-sequence";
import {
  checkRunEvaluationInput,
  type EvaluatedAgainst,
  type EvaluationOptions,
  type RunEvaluationInput,
} from "./run-evaluation-input";
import type { StepContext } from "./step-context";
import { findTimeSpan } from "./time-span";

/** One step of one cycle: its log phase, its results and its findings. */
export interface StepEvaluation {
  stepId: string;
  cycle: number;
  label: string;
  kind: ResolvedStep["kind"];
  inRepeatBlock: boolean;
  recorded: boolean;
  logPhase: LogPhaseSummary | null;
  /** Why no log phase belongs to the step, when none does. */
  logNote: string | null;
  results: StepResults | null;
  dcResistance: DcResistancePulse | null;
  findings: Finding[];
}

export interface RunEvaluation {
  evaluatedAgainst: EvaluatedAgainst & { otherThanRunVersion: boolean };
  settings: EvaluationOptions;
  steps: StepEvaluation[];
  /** Checks of the run as a whole. */
  runFindings: Finding[];
  log: RunLogSummary;
  /**
   * The procedure's decision rule, applied to every criterion. Absent in evaluations stored before the
   * procedure named its rule (those were judged by simple acceptance).
   */
  decisionRule: DecisionRule;
  /**
   * Uncertainty budgets of each discharge step's capacity and energy and each pulse step's DC
   * resistance, per cycle. Absent in evaluations stored before budgets were made: read with `?? []`.
   */
  uncertainty: StepUncertainty[];
  /** Results with no budget, and why (no cycler channel, no stated accuracy). Absent in older stored evaluations. */
  uncertaintyNotEvaluated: UncertaintyNotEvaluated[];
  /**
   * When the log's first and last samples were taken, on the wall clock (ISO 8601, UTC): the dates of
   * testing a certificate states (ISO/IEC 17025:2017 7.8.2.1 i). Absent without a log or its start time,
   * and in evaluations stored before it was recorded.
   */
  logSpan?: LogSpan;
  /** Every criterion on every cycle of its step. */
  acceptance: AcceptanceResult[];
  repeat: RepeatOutcome | null;
  /**
   * Charge retention and recovery percentages, when the procedure asks for them. Absent otherwise and in
   * evaluations stored before they were computed.
   */
  retention?: ChargeRetentionResult;
  /**
   * Observation steps' records and criteria (mass loss, open-circuit voltage share, visual state). Absent
   * when the procedure has no observation step, and in evaluations stored before observations existed.
   */
  observations?: ObservationsResult;
  /**
   * The endurance block's cycles (discharge capacity per cycle), its stop criterion and its acceptance
   * statement. Absent when the procedure has no cycle block, and in evaluations stored before blocks existed.
   */
  endurance?: EnduranceResult;
  /** The statement of conformity per criterion, on the cycle it rests on. */
  conformity: CriterionConformity[];
  verdict: RunVerdict;
}

export interface LogSpan {
  from: string;
  to: string;
  /** "log timestamps" when the log carried wall-clock time; else its elapsed time laid from the first recorded step start. */
  startedFrom: "log timestamps" | "first recorded step start";
}

/** The log's first and last samples on the wall clock, when its start is known. */
function findLogSpan(log: RunEvaluationInput["log"], logStartMs: number | null, startedFrom: LogSpan["startedFrom"] | undefined): LogSpan | undefined {
  if (log === undefined || log.length === 0 || logStartMs === null || !Number.isFinite(logStartMs)) return undefined;
  const first = log.timeS[0] as number;
  const last = log.timeS[log.length - 1] as number;
  return {
    from: new Date(logStartMs + first * 1000).toISOString(),
    to: new Date(logStartMs + last * 1000).toISOString(),
    startedFrom: startedFrom ?? "log timestamps",
  };
}

export type RunEvaluationResult = { ok: true; evaluation: RunEvaluation } | { ok: false; problems: FieldProblem[] };

/** One step of one cycle through every rule family, in the order a reviewer reads them. */
function checkStep({
  placed,
  previous,
  next,
  resolution,
}: {
  placed: PlacedStep;
  previous: PlacedStep | undefined;
  next: PlacedStep | undefined;
  resolution: ProcedureResolution;
}): Finding[] {
  const { context } = placed;
  return [
    checkStepRecorded(context),
    ...(previous ? [checkOrderAndGap({ current: placed, previous })] : []),
    ...checkLogPhaseFound(context),
    ...checkRecordMatchesLog(context),
    ...checkAmbient(context),
    ...checkDurations(context),
    ...checkRestWindow({ current: placed, previous, next }),
    ...checkSetPoints(context),
    ...checkCurrentHold(context),
    ...checkPulseTiming(context),
    ...checkEndCondition(context),
    ...checkChargeVoltage(context),
    ...checkRating(context),
    ...checkCautionsAcknowledged(context, resolution.cautions),
  ];
}

function checkResolution(resolution: ProcedureResolution, citation: string | null): Finding {
  const { errors } = resolution;
  return createRunFinding({
    rule: "procedure-resolved",
    title: "Procedure resolves on this cell",
    expected: { text: "the procedure version resolves on the cell specification without errors" },
    observed: { text: errors.length === 0 ? "no errors" : errors.map((error) => error.message).join("; ") },
    // An unresolved set-point leaves its checks open; it is not the operator's deviation.
    outcome: errors.length === 0 ? "meets" : "not assessable",
    clause: citeProcedure(citation, "set-points resolved on the cell specification"),
  });
}

function checkRecordsFit(problems: readonly string[], citation: string | null): Finding {
  return createRunFinding({
    rule: "records-fit-procedure",
    title: "Step records fit the procedure",
    expected: { text: "every record names a step of the procedure, once per cycle" },
    observed: { text: problems.length === 0 ? "all records fit" : problems.join("; ") },
    outcome: problems.length === 0 ? "meets" : "deviates",
    clause: citeProcedure(citation, "step list"),
  });
}

function describeOtherVersion(against: EvaluatedAgainst): string | null {
  const { procedureVersionId: judged, runProcedureVersionId: followed } = against;
  if (judged === undefined || followed === undefined || judged === followed) return null;
  return `Re-evaluated against procedure version ${judged}, not version ${followed} that the run followed${against.note ? ` (${against.note})` : ""}.`;
}

/** The statement per criterion: a block criterion on the repeat rule's decisive cycle, any other on cycle 1. */
function stateConformity({
  resolution,
  acceptance,
  repeat,
}: {
  resolution: ProcedureResolution;
  acceptance: readonly AcceptanceResult[];
  repeat: RepeatOutcome | null;
}): CriterionConformity[] {
  const blockIds = new Set(resolution.repeat?.stepIds ?? []);
  return resolution.acceptance.map((criterion) => {
    const inBlock = repeat !== null && blockIds.has(criterion.stepId);
    const cycle = inBlock ? repeat.decisiveCycle : 1;
    const result = acceptance.find((entry) => entry.criterionId === criterion.id && entry.cycle === cycle);
    if (inBlock && criterion.id === repeat.criterionId) {
      return {
        criterionId: criterion.id,
        outcome: repeat.specimenOutcome,
        cycle,
        statement: `${result ? `${result.statement} ` : ""}Repeat rule "${repeat.label}": ${repeat.statement}`,
      };
    }
    if (result === undefined) {
      return { criterionId: criterion.id, outcome: "not decided", cycle: null, statement: "Not decided: no cycle of its step was judged." };
    }
    return { criterionId: criterion.id, outcome: result.outcome, cycle, statement: result.statement };
  });
}

/**
 * Checks a run step by step against its resolved procedure: the records, the data log and the
 * cell's rating give findings per step and cycle; the run's instruments give the uncertainty budgets
 * of the results; the acceptance criteria, under the procedure's decision rule with those budgets'
 * expanded uncertainties, and the repeat rule, give the statement of conformity; the verdict keeps "was the
 * procedure followed?" apart from "does the specimen meet the requirement?". Pure and
 * deterministic: no clock, no randomness, the same input gives the same output, so a stored run can
 * be evaluated again (against a newer procedure version, marked in `evaluatedAgainst`).
 */
export function evaluateRun(input: RunEvaluationInput): RunEvaluationResult {
  const checked = checkRunEvaluationInput(input);
  if (!checked.ok) return checked;
  const { resolution, cellRating, stepRecords, log, logStartedAt, logStartedFrom, procedureSource, options, evaluatedAgainst, instruments } = checked.value;
  // A resolution frozen on a run planned before procedures named a rule has none: simple acceptance.
  const decisionRule = readDecisionRule(resolution);
  const citation = procedureSource ? `${procedureSource.standard} ${procedureSource.clause}` : null;
  const logStartMs = logStartedAt === undefined ? null : Date.parse(logStartedAt);
  const plan = planRunSequence({ resolution, stepRecords });
  const logAnalysis = analyseRunLog({ log, planned: plan.planned, options });
  const acknowledgedOnVersion = new Set(resolution.cautions.filter((caution) => caution.acknowledged).map((caution) => caution.code));

  const contexts = plan.planned.map(
    (entry, k): StepContext => ({
      step: entry.step,
      cycle: entry.cycle,
      record: entry.record,
      evidence: logAnalysis.evidence[k] ?? { kind: "no log", reason: "no data log was uploaded" },
      cellRating,
      settings: options,
      citation,
      logStartMs,
      isAcknowledged: (code) => acknowledgedOnVersion.has(code) || (entry.record?.acknowledgedCautionCodes.includes(code) ?? false),
    }),
  );
  const placed: PlacedStep[] = contexts.map((context) => ({ context, span: findTimeSpan(context) }));
  const steps = placed.map((current, k): StepEvaluation => {
    const { context } = current;
    const { evidence } = context;
    const logPhase = logAnalysis.summary.status === "analysed" && evidence.kind === "found" ? logAnalysis.summary.phases[evidence.phaseIndex] ?? null : null;
    return {
      stepId: context.step.id,
      cycle: context.cycle,
      label: context.step.label,
      kind: context.step.kind,
      inRepeatBlock: plan.planned[k]?.inRepeatBlock ?? false,
      recorded: context.record !== null,
      logPhase,
      logNote: evidence.kind === "found" ? null : evidence.reason,
      // A cycle block's span holds charges and discharges alike: its figures are per cycle, in `endurance`.
      results: evidence.kind === "found" && context.step.kind !== "cycle-block" ? evidence.results : null,
      dcResistance: evidence.kind === "found" ? evidence.dcResistance : null,
      findings: checkStep({ placed: current, previous: placed[k - 1], next: placed[k + 1], resolution }),
    };
  });

  const uncertainties = evaluateStepUncertainties({
    steps: steps.map((step, k) => {
      const evidence = contexts[k]?.evidence;
      const log = step.kind === "discharge" && evidence?.kind === "found" ? describeDischargeEnd(evidence.columns, evidence.phase) : null;
      return { ...step, log };
    }),
    instruments,
  });
  const acceptance = resolution.acceptance.flatMap((criterion) =>
    contexts
      .filter((context) => context.step.id === criterion.stepId)
      .map((context) =>
        evaluateAcceptance(criterion, context, {
          rule: decisionRule,
          uncertainty: findCriterionUncertainty({ criterion, step: context.step, cycle: context.cycle, uncertainties }),
        }),
      ),
  );
  const repeatEvaluation = resolution.repeat
    ? evaluateRepeatRule({ rule: resolution.repeat, cyclesRun: plan.cyclesRun, results: acceptance, citation })
    : null;
  const repeat = repeatEvaluation?.outcome ?? null;
  const runFindings = [
    checkResolution(resolution, citation),
    checkRecordsFit(plan.recordProblems, citation),
    // A procedure of observations alone has no logged step, so there is no log to look through.
    ...(log === undefined && !needsDataLog(resolution) ? [] : [checkUnexplainedLogPhases(logAnalysis.summary, citation)]),
    ...[checkInstrumentTolerances(instruments, resolution, citation)].filter((finding): finding is Finding => finding !== null),
    ...(repeatEvaluation ? [repeatEvaluation.finding] : []),
  ];
  const conformity = stateConformity({ resolution, acceptance, repeat });
  const observations = evaluateObservations(resolution.steps, stepRecords, citation);
  const endurance = evaluateEndurance({ resolution, cycleBlocks: logAnalysis.cycleBlocks, decisionRule, citation });
  const otherVersionNote = describeOtherVersion(evaluatedAgainst);
  const logSpan = findLogSpan(log, logStartMs, logStartedFrom);
  const verdict = decideVerdict({
    findings: [...runFindings, ...steps.flatMap((step) => step.findings)],
    // The observation criteria judge the specimen too; they keep their own section, apart from the acceptance criteria.
    conformity: [...conformity, ...toObservationConformity(observations), ...toEnduranceConformity(endurance)],
    otherVersionNote,
  });
  return {
    ok: true,
    evaluation: {
      evaluatedAgainst: { ...evaluatedAgainst, otherThanRunVersion: otherVersionNote !== null },
      settings: options,
      steps,
      runFindings,
      log: logAnalysis.summary,
      decisionRule,
      ...(logSpan !== undefined && { logSpan }),
      uncertainty: uncertainties.budgets,
      uncertaintyNotEvaluated: uncertainties.notEvaluated,
      acceptance,
      repeat,
      ...(resolution.retention && { retention: evaluateChargeRetention(resolution.retention, steps, citation) }),
      ...(observations !== undefined && { observations }),
      ...(endurance !== undefined && { endurance }),
      conformity,
      verdict,
    },
  };
}
