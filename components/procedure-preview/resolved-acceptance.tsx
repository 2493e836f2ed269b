import {
  assertNever,
  explainDecisionRule,
  nameDecisionRule,
  formatNumber,
  type DecisionRule,
  type RepeatRule,
  type ResolvedCriterion,
  type ResolvedStep,
  type ResolvedValue,
} from "@/protocols";
import { formatResolvedValue } from "./format-resolved";

function describeLimit(criterion: ResolvedCriterion): { words: string; sign: "≥" | "≤"; limit: ResolvedValue | null } {
  switch (criterion.kind) {
    case "capacity":
      return {
        words: `delivered capacity (${formatNumber(criterion.atLeastPercent, { maxDecimals: 2 })} % of the ${criterion.of} capacity)`,
        sign: "≥",
        limit: criterion.minimum,
      };
    case "discharge-duration":
      return { words: "discharge duration", sign: "≥", limit: criterion.minimum };
    case "resistance":
      return { words: "resistance", sign: "≤", limit: criterion.maximum };
    default:
      return assertNever(criterion);
  }
}

/** The acceptance limits for this cell, the decision rule that judges them, and the repeat rule that uses one of them. */
export function ResolvedAcceptance({
  acceptance,
  steps,
  repeat,
  decisionRule,
}: {
  acceptance: readonly ResolvedCriterion[];
  steps: readonly ResolvedStep[];
  repeat?: RepeatRule;
  decisionRule: DecisionRule;
}) {
  const nameStep = (id: string) => {
    const step = steps.find((candidate) => candidate.id === id);
    return step ? `step ${step.index + 1} “${step.label}”` : `step “${id}”`;
  };
  return (
    <section aria-labelledby="preview-acceptance" className="flex flex-col gap-2">
      <h3 id="preview-acceptance" className="font-bold">
        Acceptance limits
      </h3>
      {acceptance.length === 0 ? (
        <p className="text-sm text-ink-soft">No acceptance limit: the results are reported without a pass/fail statement.</p>
      ) : (
        <ul className="flex flex-col gap-1 text-sm">
          {acceptance.map((criterion) => {
            const { words, sign, limit } = describeLimit(criterion);
            return (
              <li key={criterion.id}>
                <span className="font-medium">{criterion.id}</span> · judges {nameStep(criterion.stepId)} · {words}{" "}
                {limit ? (
                  <>
                    <span className="figures font-medium">
                      {sign} {formatResolvedValue(limit)}
                    </span>
                    <span className="figures block text-xs text-ink-soft">{limit.explanation}</span>
                  </>
                ) : (
                  <span className="text-deviates">— not available for this cell; see the problems above</span>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {acceptance.length > 0 && (
        <p className="text-sm" data-testid="preview-decision-rule">
          Decision rule: <span className="font-medium">{nameDecisionRule(decisionRule)}</span>. <span className="text-ink-soft">{explainDecisionRule(decisionRule)}</span>
        </p>
      )}
      {repeat && (
        <p className="text-sm">
          Repeat “{repeat.label}” ({repeat.stepIds.map(nameStep).join(", ")}) up to{" "}
          <span className="figures">{repeat.maxCycles}</span> times, stopping at the first cycle that meets {repeat.stopWhenMet}.
        </p>
      )}
    </section>
  );
}
