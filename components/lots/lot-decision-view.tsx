import clsx from "clsx";
import type { LotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import type { LotVerdict, SamplingPlan } from "@/lib/lots/sampling";
import { Notice } from "@/components/ui/notice";
import { formatNumber } from "@/protocols/format-number";

const VERDICTS: Record<LotVerdict, { word: string; mark: string; box: string; tone: string }> = {
  accept: { word: "Accept the lot", mark: "✓", box: "border-meets", tone: "text-meets" },
  reject: { word: "Reject the lot", mark: "✕", box: "border-deviates", tone: "text-deviates" },
  pending: { word: "Pending", mark: "◌", box: "border-rule", tone: "text-unassessed" },
};

function cells(n: number): string {
  return `${formatNumber(n)} ${n === 1 ? "cell" : "cells"}`;
}

/** The single sampling rule in the lab's words. */
export function describeLotRule(plan: Pick<SamplingPlan, "sampleSize" | "acceptanceNumber" | "rejectionNumber">): string {
  return (
    `Accept if at most ${plan.acceptanceNumber} of the ${cells(plan.sampleSize)} sampled do not conform; ` +
    `reject as soon as ${plan.rejectionNumber} do, even before the whole sample is tested.`
  );
}

/** The lot decision: the verdict in words first, the rule it follows, and the counts it rests on. */
export function LotDecisionView({ sampling }: { sampling: LotSampling }) {
  const { plan, decision, counts } = sampling;
  if (!plan || !decision) return <p className="text-sm text-ink-soft">No decision without a sampling plan.</p>;
  const v = VERDICTS[decision.verdict];
  return (
    <div className="flex max-w-3xl flex-col gap-3">
      <div className={clsx("rounded border-l-4 bg-white px-4 py-3", v.box)} data-testid="lot-decision">
        <p className={clsx("text-lg font-bold", v.tone)}>
          <span aria-hidden="true">{v.mark} </span>
          {v.word}
        </p>
        <p className="mt-1 text-sm">{decision.statement}</p>
      </div>
      <p className="text-sm" data-testid="lot-rule">
        <span className="font-semibold">Rule: </span>
        {describeLotRule(plan)}
      </p>
      <dl className="figures grid grid-cols-[auto_1fr] gap-x-6 text-sm sm:grid-cols-[16rem_1fr]" data-testid="lot-counts">
        <dt className="border-b border-rule py-1 text-ink-soft">Sample size n</dt>
        <dd className="border-b border-rule py-1">{cells(plan.sampleSize)}</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Drawn</dt>
        <dd className="border-b border-rule py-1">{cells(counts.drawn)}</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Registered as specimens</dt>
        <dd className="border-b border-rule py-1">{cells(counts.registered)}</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Tested (conforms or does not conform)</dt>
        <dd className="border-b border-rule py-1">{cells(counts.tested)}</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Do not conform</dt>
        <dd className="border-b border-rule py-1">{cells(counts.nonconforming)}</dd>
        <dt className="py-1 text-ink-soft">Not decided</dt>
        <dd className="py-1">{cells(counts.notDecided)}</dd>
      </dl>
      {counts.notDecided > 0 && (
        <Notice tone="caution" title={`${cells(counts.notDecided)} not decided`}>
          A reviewed run that states &ldquo;not decided&rdquo; does not count as tested; its results page says why (for example a result within the
          guard band of its limit, or a repeat rule that ran out of cycles). Retest the cell, or an engineer judges it under the lab&apos;s own rules
          and records why.
        </Notice>
      )}
      {decision.verdict === "pending" && counts.drawn === 0 && <p className="text-sm text-ink-soft">Draw the sample first.</p>}
    </div>
  );
}
