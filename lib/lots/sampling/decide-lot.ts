import { formatNumber } from "@/protocols/format-number";
import type { SamplingPlan } from "./plan-sampling";
import { refuse, type SamplingInputError } from "./sampling-error";

export type LotVerdict = "accept" | "reject" | "pending";

export interface LotDecisionInput {
  plan: Pick<SamplingPlan, "sampleSize" | "acceptanceNumber" | "rejectionNumber">;
  /** Specimens of the sample tested so far. */
  tested: number;
  /** Of those, how many did not conform. */
  nonconforming: number;
}

export interface LotDecision {
  verdict: LotVerdict;
  tested: number;
  nonconforming: number;
  /** Specimens of the sample still to test; 0 once decided. */
  remaining: number;
  /** The decision rule in words, the same whatever the counts. */
  rule: string;
  /** This decision in words, with the counts. */
  statement: string;
}

export type LotDecisionResult = { ok: true; decision: LotDecision } | { ok: false; error: SamplingInputError };

function describeRule(plan: LotDecisionInput["plan"]): string {
  const { sampleSize: n, acceptanceNumber: ac, rejectionNumber: re } = plan;
  return (
    `Single sampling (ISO 2859-1): test ${formatNumber(n)} specimen${n === 1 ? "" : "s"}; ` +
    `accept the lot with ${ac} or fewer nonconforming, reject it with ${re} or more. ` +
    `The lot is rejected as soon as ${re} nonconforming are found, even before the whole sample is tested.`
  );
}

function checkCounts(input: LotDecisionInput): SamplingInputError | null {
  const { plan, tested, nonconforming } = input;
  const { sampleSize, acceptanceNumber, rejectionNumber } = plan;
  const planIsUsable =
    Number.isInteger(sampleSize) && sampleSize >= 1 && Number.isInteger(acceptanceNumber) && acceptanceNumber >= 0 && rejectionNumber === acceptanceNumber + 1;
  if (!planIsUsable) {
    return { field: "plan", message: "The sampling plan needs a sample size of at least 1 and a rejection number one above the acceptance number." };
  }
  if (!Number.isInteger(tested) || tested < 0) {
    return { field: "tested", message: `The number tested must be a whole number, 0 or more (got ${String(tested)}).` };
  }
  if (tested > sampleSize) {
    return { field: "tested", message: `${tested} specimens tested is more than the sample of ${sampleSize} the plan calls for.` };
  }
  if (!Number.isInteger(nonconforming) || nonconforming < 0) {
    return { field: "nonconforming", message: `The number nonconforming must be a whole number, 0 or more (got ${String(nonconforming)}).` };
  }
  if (nonconforming > tested) {
    return { field: "nonconforming", message: `${nonconforming} nonconforming is more than the ${tested} specimens tested.` };
  }
  return null;
}

/**
 * The lot decision of a single sampling plan: reject once the nonconforming reach Re (further
 * results cannot lower the count), accept when the whole sample is tested with at most Ac, and
 * otherwise wait for the rest of the sample.
 */
export function decideLot(input: LotDecisionInput): LotDecisionResult {
  const problem = checkCounts(input);
  if (problem) return refuse(problem.field, problem.message);
  const { plan, tested, nonconforming } = input;
  const rule = describeRule(plan);
  const counts = `${nonconforming} nonconforming of ${formatNumber(tested)} tested`;
  if (nonconforming >= plan.rejectionNumber) {
    const statement = `${counts} reaches the rejection number ${plan.rejectionNumber}: reject.`;
    return { ok: true, decision: { verdict: "reject", tested, nonconforming, remaining: 0, rule, statement } };
  }
  const remaining = plan.sampleSize - tested;
  if (remaining === 0) {
    const statement = `${counts} is within the acceptance number ${plan.acceptanceNumber}: accept.`;
    return { ok: true, decision: { verdict: "accept", tested, nonconforming, remaining, rule, statement } };
  }
  const statement = `${counts}; ${formatNumber(remaining)} still to test: pending.`;
  return { ok: true, decision: { verdict: "pending", tested, nonconforming, remaining, rule, statement } };
}
