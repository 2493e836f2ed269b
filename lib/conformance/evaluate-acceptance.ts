import { assertNever, type ResolvedCriterion, type StoredDecisionRule } from "@/protocols";
import { hasStoppedBeforeEndVoltage } from "./check-end-condition";
import { citeStatementOfConformity, evaluateConformity, usesGuardBand, type ConformityOutcome, type DecisionRule, type SpecificationLimit } from "./decision-rule";
import type { CriterionUncertainty, UncertaintyQuantity } from "./evaluate-uncertainty";
import type { FindingUnit, FindingValue } from "./finding";
import { citeProcedure, formatValue } from "./format-value";
import type { StepContext } from "./step-context";

/** How a criterion is judged: the procedure's decision rule and the measured value's uncertainty. */
export interface AcceptanceJudgement {
  rule: DecisionRule;
  uncertainty: CriterionUncertainty;
}

/** One acceptance criterion judged on one cycle of its step. */
export interface AcceptanceResult {
  criterionId: string;
  kind: ResolvedCriterion["kind"];
  stepId: string;
  cycle: number;
  limit: (FindingValue & { side: SpecificationLimit["side"] }) | null;
  measured: FindingValue | null;
  outcome: ConformityOutcome;
  /** The rule applied; evaluations stored before ILAC-G8's three rules were offered may say "guarded acceptance". */
  rule: StoredDecisionRule;
  /** U in the criterion's unit (Ah, s, Ω), when the step's budget gives one. */
  expandedUncertainty: number | null;
  /**
   * Where U came from (the step's budget: quantity, U/|y|, k), or why it was not evaluated. Absent
   * in evaluations stored before budgets were made.
   */
  uncertainty: { evaluated: true; quantity: UncertaintyQuantity; relativeExpanded: number; coverageFactor: number } | { evaluated: false; reason: string };
  /** The decision rule applied and its outcome in words, for the certificate. */
  statement: string;
  clause: string;
  notes: string[];
}

interface Quantity {
  unit: FindingUnit;
  /** Written in the statement in this unit, this many decimals, after multiplying by scale. */
  statementUnit: string;
  scale: number;
  decimals: number;
}

const quantities: Record<ResolvedCriterion["kind"], Quantity> = {
  capacity: { unit: "Ah", statementUnit: "Ah", scale: 1, decimals: 3 },
  "discharge-duration": { unit: "s", statementUnit: "s", scale: 1, decimals: 0 },
  resistance: { unit: "Ω", statementUnit: "mΩ", scale: 1000, decimals: 2 },
};

function findLimit(criterion: ResolvedCriterion): { side: SpecificationLimit["side"]; value: number; explanation: string } | null {
  switch (criterion.kind) {
    case "capacity":
      return criterion.minimum && { side: "lower", value: criterion.minimum.value, explanation: criterion.minimum.explanation };
    case "discharge-duration":
      return { side: "lower", value: criterion.minimum.value, explanation: criterion.minimum.explanation };
    case "resistance":
      return criterion.maximum && { side: "upper", value: criterion.maximum.value, explanation: criterion.maximum.explanation };
    default:
      return assertNever(criterion);
  }
}

/** The measured value a criterion judges, from the step's log results or its record, or why there is none. */
function findMeasured(criterion: ResolvedCriterion, context: StepContext): { value: number; source: string } | { reason: string } {
  const { evidence } = context;
  const noLog = evidence.kind === "found" ? null : evidence.reason;
  switch (criterion.kind) {
    case "capacity":
      if (evidence.kind !== "found") return { reason: noLog ?? "no log phase" };
      return { value: evidence.results.capacityAh, source: "Q = ∫|I| dt over the logged discharge" };
    case "discharge-duration":
      if (evidence.kind !== "found") return { reason: noLog ?? "no log phase" };
      return { value: evidence.results.durationS, source: "duration of the logged discharge" };
    case "resistance": {
      if (context.step.kind === "measure") {
        const value = context.record?.measured?.acResistanceOhm;
        return value === undefined ? { reason: "no AC resistance was recorded" } : { value, source: "AC resistance as recorded" };
      }
      if (evidence.kind !== "found") return { reason: noLog ?? "no log phase" };
      if (evidence.dcResistance === null) return { reason: "no two-level pulse was found in the logged phase" };
      return { value: evidence.dcResistance.resistanceOhm, source: "Rdc = (U1 − U2) / (I2 − I1) from the logged pulse" };
    }
    default:
      return assertNever(criterion);
  }
}

const notGiven: AcceptanceJudgement = { rule: "simple acceptance", uncertainty: { evaluated: false, reason: "no uncertainty budget was given" } };

/**
 * Judges one criterion on one cycle under the procedure's decision rule (decision-rule.ts), with the
 * expanded uncertainty of the step's budget as the guard band w = U of the two guard-band rules.
 * Without a budget, simple acceptance still decides (and says the uncertainty was not evaluated);
 * the guard-band rules cannot, so the result is not decided with that reason.
 * A discharge that stopped before its end voltage could only have delivered more, so a shortfall
 * on it is not decided rather than a failure (definition: capacity to the end voltage is at least
 * the capacity delivered so far).
 */
export function evaluateAcceptance(criterion: ResolvedCriterion, context: StepContext, judgement: AcceptanceJudgement = notGiven): AcceptanceResult {
  const quantity = quantities[criterion.kind];
  const { rule } = judgement;
  const limit = findLimit(criterion);
  const measured = findMeasured(criterion, context);
  const budget = judgement.uncertainty.evaluated ? judgement.uncertainty.budget : null;
  const uncertainty: AcceptanceResult["uncertainty"] = judgement.uncertainty.evaluated
    ? {
        evaluated: true,
        quantity: judgement.uncertainty.quantity,
        relativeExpanded: judgement.uncertainty.budget.relativeExpandedUncertainty,
        coverageFactor: judgement.uncertainty.budget.coverageFactor,
      }
    : { evaluated: false, reason: judgement.uncertainty.reason };
  const base = {
    criterionId: criterion.id,
    kind: criterion.kind,
    stepId: criterion.stepId,
    cycle: context.cycle,
    rule,
    clause: `${citeProcedure(context.citation, "acceptance criterion")}; decision rule: ${citeStatementOfConformity(rule)}`,
    limit: limit && { text: `${limit.side === "lower" ? "at least" : "at most"} ${limit.explanation}`, value: limit.value, side: limit.side, unit: quantity.unit },
    measured: "reason" in measured ? null : { text: `${formatValue(measured.value, quantity.unit)}, ${measured.source}`, value: measured.value, unit: quantity.unit },
    uncertainty,
  };
  // U scales with the measured value: the budget's relative U times |y| (the budget is made at this very value).
  const expanded = budget === null || "reason" in measured ? null : budget.relativeExpandedUncertainty * Math.abs(measured.value);
  const uncertaintyNote = uncertainty.evaluated ? null : `Measurement uncertainty not evaluated: ${uncertainty.reason}.`;
  const undecided = (why: string): AcceptanceResult => ({ ...base, expandedUncertainty: expanded, outcome: "not decided", statement: `Not decided: ${why}.`, notes: [] });
  if (limit === null) return undecided("the limit is not resolved on this cell specification");
  if ("reason" in measured) return undecided(measured.reason);
  if (usesGuardBand(rule) && expanded === null) {
    return undecided(`a guard band w = U needs the expanded uncertainty, and it was not evaluated (${uncertainty.evaluated ? "no budget" : uncertainty.reason})`);
  }

  const decision = evaluateConformity({
    measured: measured.value * quantity.scale,
    limit: { side: limit.side, value: limit.value * quantity.scale },
    rule,
    ...(expanded !== null && { expandedUncertainty: expanded * quantity.scale }),
    ...(budget !== null && { coverageFactor: budget.coverageFactor }),
    unit: quantity.statementUnit,
    decimals: quantity.decimals,
  });
  if (!decision.ok) return undecided(decision.error.message.replace(/\.$/, ""));
  const notes: string[] = [];
  let outcome = decision.value.outcome;
  const evidence = context.evidence;
  if (limit.side === "lower" && evidence.kind === "found" && hasStoppedBeforeEndVoltage(context.step, evidence.results)) {
    notes.push("The discharge stopped before its end voltage; a complete discharge could only have delivered more.");
    if (outcome === "does not conform" || outcome === "conditional fail") outcome = "not decided";
  }
  const statement = outcome === decision.value.outcome ? decision.value.statement : `${decision.value.statement} Not decided, as the discharge stopped early.`;
  return { ...base, expandedUncertainty: expanded, outcome, statement: uncertaintyNote === null ? statement : `${statement} ${uncertaintyNote}`, notes };
}
