import { formatNumber, type ResolvedChargeRetention } from "@/protocols";
import { formatValue } from "./format-value";

/** One of the two percentages: the capacity of its discharge as a share of the basis. */
export interface RetentionShare {
  stepId: string;
  label: string;
  /** Capacity of the step's discharge on the first cycle, Ah; null when the log gave none. */
  capacityAh: number | null;
  /** capacityAh / basis × 100; null when either is missing. */
  percent: number | null;
  /** The result in words, with its basis: "85.0 % of the rated capacity (2.550 Ah of 3.000 Ah)". */
  statement: string;
}

export interface ChargeRetentionResult {
  basis: {
    kind: ResolvedChargeRetention["basis"]["kind"];
    /** "the rated capacity 3.000 Ah" or "the capacity measured before storage (step "…") …". */
    words: string;
    capacityAh: number | null;
  };
  retention: RetentionShare;
  recovery: RetentionShare;
  /** The procedure's standard and clause, e.g. "IEC 61960-3:2017 7.4"; null when not named. */
  citation: string | null;
}

/** The steps' measured capacities, as the run evaluation holds them. */
export interface RetentionStepInput {
  stepId: string;
  cycle: number;
  label: string;
  results: { capacityAh: number } | null;
}

function findCapacity(steps: readonly RetentionStepInput[], stepId: string): { label: string; capacityAh: number | null } {
  // A storage procedure runs once; were its steps repeated, the first cycle is the one stored.
  const step = steps.find((entry) => entry.stepId === stepId && entry.cycle === 1);
  return { label: step?.label ?? stepId, capacityAh: step?.results?.capacityAh ?? null };
}

function describeShare(share: Omit<RetentionShare, "statement">, basis: ChargeRetentionResult["basis"]): string {
  if (share.capacityAh === null) return `Not computed: the data log gave no capacity for "${share.label}".`;
  if (basis.capacityAh === null || share.percent === null) return `Not computed: ${basis.words} is not known.`;
  return (
    `${formatNumber(share.percent, { minDecimals: 1, maxDecimals: 1 })} % of ${basis.words} ` +
    `(${formatValue(share.capacityAh, "Ah")} of ${formatValue(basis.capacityAh, "Ah")})`
  );
}

/**
 * Charge retention and recovery (IEC 61960-3, charge (capacity) retention and recovery; clause recalled):
 * retention % = Q(discharge after storage) / Q(basis) × 100, recovery % = Q(discharge after the recharge) /
 * Q(basis) × 100, the basis being the rated capacity or the capacity measured before storage, as the
 * procedure says. Percentages are not rounded here; the words round to 0.1 %.
 */
export function evaluateChargeRetention(
  retention: ResolvedChargeRetention,
  steps: readonly RetentionStepInput[],
  citation: string | null = null,
): ChargeRetentionResult {
  const basis: ChargeRetentionResult["basis"] = (() => {
    switch (retention.basis.kind) {
      case "rated capacity":
        return { kind: retention.basis.kind, words: "the rated capacity", capacityAh: retention.basis.capacityAh };
      case "capacity before storage": {
        const before = findCapacity(steps, retention.basis.stepId);
        return { kind: retention.basis.kind, words: `the capacity measured before storage ("${before.label}")`, capacityAh: before.capacityAh };
      }
      default: {
        const unknown: never = retention.basis;
        throw new Error(`Unknown retention basis ${JSON.stringify(unknown)}`);
      }
    }
  })();
  const share = (stepId: string): RetentionShare => {
    const { label, capacityAh } = findCapacity(steps, stepId);
    const percent = capacityAh !== null && basis.capacityAh !== null && basis.capacityAh > 0 ? (capacityAh / basis.capacityAh) * 100 : null;
    const partial = { stepId, label, capacityAh, percent };
    return { ...partial, statement: describeShare(partial, basis) };
  };
  return { basis, retention: share(retention.afterStorageStepId), recovery: share(retention.recoveryStepId), citation };
}

/** The two rows as a report lists them, in the lab's words. */
export function listRetentionRows(result: ChargeRetentionResult): { name: string; share: RetentionShare }[] {
  return [
    { name: "Charge retention (after storage)", share: result.retention },
    { name: "Charge recovery (after recharging)", share: result.recovery },
  ];
}

/** "the rated capacity, 3 000 mAh": what each percentage is a share of. */
export function formatRetentionReference(result: ChargeRetentionResult): string {
  return `${result.basis.words}, ${result.basis.capacityAh === null ? "not known" : formatValue(result.basis.capacityAh, "Ah")}`;
}

/** The line above the two results: their basis and the clause they answer. */
export function formatRetentionBasis(result: ChargeRetentionResult): string {
  const clause = result.citation === null ? "" : ` (${result.citation}, charge retention and recovery)`;
  return `Both percentages are of ${formatRetentionReference(result)}, as the procedure sets${clause}.`;
}
