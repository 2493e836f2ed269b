import type { StepEvaluation, StepUncertainty, UncertaintyNotEvaluated, UncertaintyQuantity } from "@/lib/conformance";
import { UncertaintyBudgetTable } from "./uncertainty-budget-table";

const QUANTITY_WORDS: Record<UncertaintyQuantity, string> = { capacity: "capacity", energy: "energy", "dc-resistance": "DC resistance" };

function nameStep(steps: readonly StepEvaluation[], stepId: string, cycle: number): string {
  const label = steps.find((step) => step.stepId === stepId)?.label ?? stepId;
  return `${label}${cycle > 1 ? `, cycle ${cycle}` : ""}`;
}

/**
 * The uncertainty budgets of the run's results, step by step in run order: capacity and energy of each
 * discharge, DC resistance of each pulse; then the results that have none, with the reason.
 * `uncertainty` is undefined for an evaluation stored before budgets were made.
 */
export function UncertaintySection({
  steps,
  uncertainty,
  notEvaluated,
}: {
  steps: readonly StepEvaluation[];
  uncertainty: readonly StepUncertainty[] | undefined;
  notEvaluated: readonly UncertaintyNotEvaluated[] | undefined;
}) {
  if (uncertainty === undefined) {
    return <p className="text-sm text-ink-soft">This evaluation was made before uncertainty budgets were computed. Evaluate the run again to see them.</p>;
  }
  const missing = notEvaluated ?? [];
  return (
    <div className="flex flex-col gap-6">
      <p className="max-w-3xl text-sm text-ink-soft">
        After JCGM 100:2008 (GUM): each limit the instrument register states for the run&apos;s cycler channel is read as a rectangular
        distribution (u = a/√3), the relative uncertainties of the inputs are combined in quadrature, and the result is expanded with k = 2
        (about 95 % coverage). A channel&apos;s gain error is taken as common to the two readings of a pulse.
      </p>
      {uncertainty.length === 0 && missing.length === 0 && <p className="text-sm">No discharge or pulse step has a logged result, so there is nothing to budget.</p>}
      {uncertainty.map((entry) => (
        <UncertaintyBudgetTable
          key={`${entry.stepId}#${entry.cycle}/${entry.quantity}`}
          budget={entry.budget}
          title={`${nameStep(steps, entry.stepId, entry.cycle)}: ${QUANTITY_WORDS[entry.quantity]}`}
        />
      ))}
      {missing.length > 0 && (
        <div className="text-sm" data-testid="uncertainty-not-evaluated">
          <p className="font-semibold">Not evaluated</p>
          <ul className="list-disc pl-5">
            {missing.map((entry) => (
              <li key={`${entry.stepId}#${entry.cycle}/${entry.quantity}`}>
                {nameStep(steps, entry.stepId, entry.cycle)}, {QUANTITY_WORDS[entry.quantity]}: {entry.reason}.
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
