/** The three outcomes of one check (docs/design.md §3). */
export type FindingOutcome = "meets" | "deviates" | "not assessable";

/** Stable codes of the checks; stored with the finding, so never rename one. */
export type FindingRule =
  | "procedure-resolved"
  | "records-fit-procedure"
  | "no-unexplained-log-phase"
  | "repeat-rule-followed"
  | "step-recorded"
  | "in-order-without-gap"
  | "log-phase-found"
  | "record-matches-log"
  | "ambient-in-range"
  | "duration-within-limits"
  | "set-point-matches"
  | "current-held"
  | "end-voltage-reached"
  | "termination-reached"
  | "charge-voltage-within-limit"
  | "current-within-rating"
  | "caution-acknowledged"
  | "rest-window-within-limit"
  | "pulse-timing"
  | "instruments-meet-tolerances";

export type FindingUnit = "A" | "V" | "s" | "°C" | "Ah" | "Ω";

/** What was expected or observed: words for people, and the numbers behind them when there are any. */
export interface FindingValue {
  text: string;
  value?: number;
  min?: number;
  max?: number;
  unit?: FindingUnit;
}

export interface Finding {
  /** Unique within one evaluation: "<step>#<cycle>/<rule>[/<field>]", or "run/<rule>" for the run as a whole. */
  id: string;
  /** Null for a check of the run as a whole. */
  stepId: string | null;
  /** 1-based cycle of a repeated block (1 outside it); null for the run as a whole. */
  cycle: number | null;
  rule: FindingRule;
  title: string;
  expected: FindingValue;
  observed: FindingValue;
  outcome: FindingOutcome;
  /** Where the requirement comes from: a standard's clause, the procedure, or "common practice". */
  clause: string;
  /** Set on safety checks (docs/design.md §7). */
  severity?: "caution";
  /** The step ran outside the cell's rating (acknowledged or not); the result is marked so. */
  beyondRating?: boolean;
  note?: string;
}

export type FindingDraft = Omit<Finding, "id" | "stepId" | "cycle"> & {
  /** Tells apart several findings of one rule on one step, e.g. "current". */
  field?: string;
};

/** A finding on one step of one cycle. */
export function createStepFinding(where: { stepId: string; cycle: number }, draft: FindingDraft): Finding {
  const { field, ...rest } = draft;
  const id = `${where.stepId}#${where.cycle}/${draft.rule}${field === undefined ? "" : `/${field}`}`;
  return { id, stepId: where.stepId, cycle: where.cycle, ...rest };
}

/** A finding on the run as a whole. */
export function createRunFinding(draft: FindingDraft): Finding {
  const { field, ...rest } = draft;
  return { id: `run/${draft.rule}${field === undefined ? "" : `/${field}`}`, stepId: null, cycle: null, ...rest };
}
