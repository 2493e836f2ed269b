import { z } from "zod";
import { upgradeDecisionRule, type DecisionRule, type StoredDecisionRule } from "@/protocols";
import type { RunLogSummary } from "./analyse-run-log";
import type { CriterionConformity, RunVerdict } from "./decide-verdict";
import type { AcceptanceResult } from "./evaluate-acceptance";
import type { RepeatOutcome } from "./evaluate-repeat-rule";
import type { ChargeRetentionResult } from "./evaluate-retention";
import type { RunEvaluation, StepEvaluation } from "./evaluate-run";
import type { StepUncertainty, UncertaintyNotEvaluated } from "./evaluate-uncertainty";
import type { ObservationsResult } from "./evaluate-observations";
import type { EnduranceResult } from "./evaluate-endurance";
import type { Finding } from "./finding";
import type { EvaluationOptions } from "./run-evaluation-input";

/**
 * How run_evaluation.evaluation is written. Format 2 is today's RunEvaluation with `format: 2`.
 * Rows without a format (format 1) were written before the procedure named its decision rule and before
 * uncertainty budgets: they are read with the stated defaults below. A change to the stored shape takes
 * the next number here and an upgrade from the one before.
 */
export const STORED_EVALUATION_FORMAT = 2;

/** A stored evaluation as every reader sees it: today's shape, whatever format the row was written in. */
export interface StoredEvaluation extends RunEvaluation {
  format: typeof STORED_EVALUATION_FORMAT;
  /**
   * The decision rule as the record names it: an older record may use an earlier name ("guarded
   * acceptance"), which `decisionRule` gives in today's words. A certificate states the record's own.
   */
  statedDecisionRule: StoredDecisionRule;
}

/** The JSON written to run_evaluation.evaluation for an evaluation made now. */
export function toStoredEvaluation(evaluation: RunEvaluation): RunEvaluation & { format: typeof STORED_EVALUATION_FORMAT } {
  return { format: STORED_EVALUATION_FORMAT, ...evaluation };
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const isText = (v: unknown) => typeof v === "string";
const isWhole = (v: unknown) => typeof v === "number" && Number.isInteger(v);

/**
 * A part of the evaluation checked for the fields readers rely on; the rest of it is carried as written
 * (the evaluation is made by lib/conformance alone, so its deeper parts are trusted once the shape holds).
 */
function shaped<T>(what: string, check: (v: Record<string, unknown>) => boolean = () => true) {
  return z.custom<T>((v) => isRecord(v) && check(v), { message: `${what} is not as an evaluation stores it` });
}

const findingSchema = shaped<Finding>("a finding", (f) => isText(f.id) && isText(f.title) && isText(f.outcome) && isText(f.rule));
const stepSchema = shaped<StepEvaluation>(
  "a step",
  (s) => isText(s.stepId) && isWhole(s.cycle) && isText(s.label) && isText(s.kind) && Array.isArray(s.findings) && s.findings.every((f) => findingSchema.safeParse(f).success),
);
const quantitySchema = z.enum(["capacity", "energy", "dc-resistance"]);
const uncertaintySchema = shaped<StepUncertainty>("an uncertainty budget", (u) => isText(u.stepId) && isWhole(u.cycle) && quantitySchema.safeParse(u.quantity).success && isRecord(u.budget));
const notEvaluatedSchema = shaped<UncertaintyNotEvaluated>("a result without a budget", (u) => isText(u.stepId) && isWhole(u.cycle) && isText(u.quantity) && isText(u.reason));
const ruleNameSchema = z.enum(["simple acceptance", "binary guard band", "non-binary guard band", "guarded acceptance"]);

/** What every format holds. */
const commonShape = {
  evaluatedAgainst: shaped<RunEvaluation["evaluatedAgainst"]>("what the run was evaluated against", (e) => typeof e.otherThanRunVersion === "boolean"),
  settings: shaped<EvaluationOptions>("the evaluation settings"),
  steps: z.array(stepSchema),
  runFindings: z.array(findingSchema),
  log: shaped<RunLogSummary>("the log summary"),
  logSpan: z.object({ from: z.string(), to: z.string(), startedFrom: z.enum(["log timestamps", "first recorded step start"]) }).optional(),
  acceptance: z.array(shaped<AcceptanceResult>("an acceptance result", (a) => isText(a.criterionId) && isText(a.stepId) && isWhole(a.cycle))),
  repeat: shaped<RepeatOutcome>("the repeat outcome").nullable(),
  retention: shaped<ChargeRetentionResult>("the charge retention", (r) => isRecord(r.basis)).optional(),
  observations: shaped<ObservationsResult>("the observations", (o) => Array.isArray(o.records) && Array.isArray(o.criteria) && isText(o.decisionRule)).optional(),
  endurance: shaped<EnduranceResult>("the endurance cycles", (e) => isText(e.stepId) && Array.isArray(e.cycles) && isRecord(e.stop) && isRecord(e.acceptance)).optional(),
  conformity: z.array(shaped<CriterionConformity>("a statement of conformity", (c) => isText(c.criterionId) && isText(c.outcome) && isText(c.statement))),
  verdict: shaped<RunVerdict>("the verdict", (v) => isText(v.procedureFollowed) && isText(v.specimenConforms) && typeof v.beyondRating === "boolean" && Array.isArray(v.reasons)),
};

const format2Schema = z.object({
  ...commonShape,
  format: z.literal(2),
  decisionRule: ruleNameSchema,
  uncertainty: z.array(uncertaintySchema),
  uncertaintyNotEvaluated: z.array(notEvaluatedSchema),
});

/** Format 1: no `format`; the decision rule, the budgets and the results without one may be missing. */
const format1Schema = z.object({
  ...commonShape,
  decisionRule: ruleNameSchema.optional(),
  uncertainty: z.array(uncertaintySchema).optional(),
  uncertaintyNotEvaluated: z.array(notEvaluatedSchema).optional(),
});

/**
 * Format 1 → 2, with these defaults: the decision rule is the evaluation's own, else the one its first
 * acceptance result names, else the one its settings name, else simple acceptance (how those runs were
 * judged); no budgets and no list of results without one (their uncertainty was not evaluated).
 */
function upgradeFormat1(old: z.infer<typeof format1Schema>): StoredEvaluation {
  const settingsRule = ruleNameSchema.safeParse((old.settings as { decisionRule?: unknown }).decisionRule);
  const firstCriterionRule = ruleNameSchema.safeParse(old.acceptance[0]?.rule);
  const stated: StoredDecisionRule = old.decisionRule ?? (firstCriterionRule.success ? firstCriterionRule.data : undefined) ?? (settingsRule.success ? settingsRule.data : undefined) ?? "simple acceptance";
  return {
    ...old,
    format: STORED_EVALUATION_FORMAT,
    decisionRule: upgradeDecisionRule(stated),
    statedDecisionRule: stated,
    uncertainty: old.uncertainty ?? [],
    uncertaintyNotEvaluated: old.uncertaintyNotEvaluated ?? [],
  };
}

/** A stored evaluation that cannot be read: the row was not written by lib/runs/evaluate-stored-run.ts. */
export class StoredEvaluationError extends Error {}

/**
 * Reads run_evaluation.evaluation (as the database hands back its JSON) in today's shape, upgrading an
 * older format. The one place a stored evaluation becomes a RunEvaluation.
 */
export function parseStoredEvaluation(stored: unknown): StoredEvaluation {
  const format = isRecord(stored) ? stored.format : undefined;
  if (format === undefined) {
    const old = format1Schema.safeParse(stored);
    if (!old.success) throw unreadable(old.error);
    return upgradeFormat1(old.data);
  }
  const current = format2Schema.safeParse(stored);
  if (!current.success) throw unreadable(current.error);
  const decisionRule: DecisionRule = upgradeDecisionRule(current.data.decisionRule);
  return { ...current.data, format: STORED_EVALUATION_FORMAT, decisionRule, statedDecisionRule: current.data.decisionRule };
}

function unreadable(error: z.ZodError): StoredEvaluationError {
  const where = error.issues.slice(0, 3).map((i) => `${i.path.join(".") || "the evaluation"}: ${i.message}`);
  return new StoredEvaluationError(`A stored evaluation cannot be read (${where.join("; ")}).`);
}
