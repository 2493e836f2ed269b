import { assertNever, compareNumbers, type CautionKind, type ResolvedSetPoint } from "@/protocols";
import type { Finding } from "./finding";
import { commonPractice, formatValue } from "./format-value";
import type { CellRating } from "./run-evaluation-input";
import { createFinding, type StepContext } from "./step-context";
import type { ProgrammedField } from "./step-record";

interface RatedCurrent {
  field: Extract<ProgrammedField, "current" | "baseCurrent" | "pulseCurrent">;
  words: string;
  resolved: ResolvedSetPoint;
  direction: "charge" | "discharge";
}

function listRatedCurrents(context: StepContext): RatedCurrent[] {
  const { step } = context;
  switch (step.kind) {
    case "charge":
      return [{ field: "current", words: "charge current", resolved: step.current, direction: "charge" }];
    case "discharge":
      return [{ field: "current", words: "discharge current", resolved: step.current, direction: "discharge" }];
    case "pulse":
      return [
        { field: "baseCurrent", words: "base current", resolved: step.baseCurrent, direction: "discharge" },
        { field: "pulseCurrent", words: "pulse current", resolved: step.pulseCurrent, direction: "discharge" },
      ];
    case "rest":
    case "soak":
    case "measure":
    case "observe":
    // A cycle block is judged cycle by cycle from the log in evaluate-endurance.ts.
    case "cycle-block":
      return [];
    default:
      return assertNever(step);
  }
}

/** The datasheet limit for a direction, as protocols' resolveProcedure takes it. */
function findLimit(rating: CellRating, direction: RatedCurrent["direction"]): { value: number; words: string } | null {
  switch (direction) {
    case "discharge":
      return { value: rating.maxContinuousDischargeCurrentA, words: "maximum continuous discharge current" };
    case "charge":
      if (rating.maxChargeCurrentA !== undefined) return { value: rating.maxChargeCurrentA, words: "maximum charge current" };
      if (rating.standardChargeCurrentA !== undefined) {
        return { value: rating.standardChargeCurrentA, words: "standard charge current (no maximum stated)" };
      }
      return null;
    default:
      return assertNever(direction);
  }
}

function checkRatedCurrent(context: StepContext, current: RatedCurrent): Finding {
  const limit = findLimit(context.cellRating, current.direction);
  const programmed = context.record?.programmed[current.field];
  const value = programmed ?? current.resolved?.value;
  // The code protocols' resolveProcedure gives the same caution, so one acknowledgement serves both.
  const kind: CautionKind = current.direction === "charge" ? "charge-current-above-rating" : "discharge-current-above-rating";
  const code = `${kind}/${context.step.id}/${current.field}`;
  const draft = {
    rule: "current-within-rating" as const,
    field: current.field,
    title: `${current.words[0]?.toUpperCase()}${current.words.slice(1)} within the cell's rating`,
    severity: "caution" as const,
    expected:
      limit === null
        ? { text: "the cell specification states no charge current limit", unit: "A" as const }
        : {
            text: `at most the cell's ${limit.words} ${formatValue(limit.value, "A")}, or outside it only with its caution acknowledged`,
            max: limit.value,
            unit: "A" as const,
          },
    clause: `cell rating from the cell specification; ${commonPractice}`,
  };
  if (limit === null || value === undefined) {
    const reason = limit === null ? "no limit to compare with" : "neither the procedure nor the record gives the current";
    return createFinding(context, { ...draft, observed: { text: reason }, outcome: "not assessable" });
  }
  const source = programmed === undefined ? "as set in the procedure (the programmed value was not recorded)" : "programmed";
  const observedText = `${formatValue(value, "A")} ${source}`;
  if (compareNumbers(value, limit.value) !== "higher") {
    return createFinding(context, { ...draft, observed: { text: observedText, value, unit: "A" }, outcome: "meets" });
  }
  const acknowledged = context.isAcknowledged(code);
  // Who acknowledged, and when: the operator before starting the step, or the procedure's engineer on the version.
  const byOperator = context.record?.acknowledgedCautionCodes.includes(code) ? context.record.cautionsAcknowledged : undefined;
  const acknowledgedBy = byOperator ? `acknowledged by ${byOperator.by} at ${byOperator.at}` : "acknowledged on the released procedure version";
  return createFinding(context, {
    ...draft,
    observed: {
      text: `${observedText}: outside the rating, ${acknowledged ? acknowledgedBy : "the caution was not acknowledged"}`,
      value,
      unit: "A",
    },
    outcome: acknowledged ? "meets" : "deviates",
    beyondRating: true,
    note: acknowledged ? "Outside the cell's rating with acknowledgement of its caution; the result is marked so." : "Acknowledge its caution before running outside the rating.",
  });
}

/**
 * Each current stays within the cell's rating: the maximum continuous discharge current for a
 * discharge or pulse, the maximum (else standard) charge current for a charge. Above it the step
 * may run only once its caution is acknowledged, and the result is then marked as beyond the
 * rating (common practice, docs/references.md §12; docs/design.md §7). The programmed value is judged; the
 * resolved one stands in when none was recorded.
 */
export function checkRating(context: StepContext): Finding[] {
  return listRatedCurrents(context).map((current) => checkRatedCurrent(context, current));
}
