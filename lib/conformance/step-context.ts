import type { DcResistancePulse, LogColumns, Phase, StepResults } from "@/lib/analysis";
import type { ResolvedStep } from "@/protocols";
import { createStepFinding, type Finding, type FindingDraft } from "./finding";
import type { CellRating, EvaluationOptions } from "./run-evaluation-input";
import type { StepRecord } from "./step-record";

/** What the data log shows of one step of one cycle. */
export type LogEvidence =
  | { kind: "no log"; reason: string }
  | { kind: "not found"; reason: string }
  | {
      kind: "found";
      columns: LogColumns;
      phase: Phase;
      phaseIndex: number;
      results: StepResults;
      /** The two current levels and Rdc of a pulse step; null for other steps or when none was found. */
      dcResistance: DcResistancePulse | null;
    };

/** Start and end of a step on one time base: seconds of the log (timeS), or seconds of the wall clock. */
export interface TimeSpan {
  startS: number;
  endS: number;
  base: "log" | "clock";
  source: "log" | "record";
}

/** Everything one rule needs to judge one step of one cycle. */
export interface StepContext {
  step: ResolvedStep;
  cycle: number;
  record: StepRecord | null;
  evidence: LogEvidence;
  cellRating: CellRating;
  settings: EvaluationOptions;
  /** "IEC 61960-3:2017 7.2, 7.3.1", or null when the caller did not name the procedure's source. */
  citation: string | null;
  /** Milliseconds since 1970 of the log's first sample, when recorded. */
  logStartMs: number | null;
  /** A caution code acknowledged on the procedure version or on this step's record. */
  isAcknowledged(code: string): boolean;
}

/** A finding on the context's step and cycle. */
export function createFinding(context: StepContext, draft: FindingDraft): Finding {
  return createStepFinding({ stepId: context.step.id, cycle: context.cycle }, draft);
}

/** The reason a rule that needs the log cannot judge this step, or null when the log shows it. */
export function explainMissingLog(evidence: LogEvidence): string | null {
  switch (evidence.kind) {
    case "no log":
    case "not found":
      return evidence.reason;
    case "found":
      return null;
    default: {
      const unknown: never = evidence;
      throw new Error(`Unknown log evidence ${JSON.stringify(unknown)}`);
    }
  }
}

export const noRecordReason = "no step record";
