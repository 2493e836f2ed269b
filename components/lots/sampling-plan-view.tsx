import { TextLink } from "@/components/ui/text-link";
import type { SamplingPlan } from "@/lib/lots/sampling";
import { formatNumber } from "@/protocols/format-number";
import { INSPECTION_LEVEL_WORDS } from "./inspection-level-words";

const row = "border-b border-rule py-1";

/** A lot's plan as the tables gave it: the figures, each step in words, and the source. */
export function SamplingPlanView({
  plan,
  acceptanceProcedure,
  setBy,
}: {
  plan: SamplingPlan;
  acceptanceProcedure: { id: string; code: string } | null;
  setBy: { name: string; at: string } | null;
}) {
  return (
    <div className="flex flex-col gap-3">
      <dl className="figures grid max-w-3xl gap-x-6 text-sm sm:grid-cols-[14rem_1fr]" data-testid="sampling-plan">
        <dt className={`${row} text-ink-soft`}>Inspection level</dt>
        <dd className={row}>{INSPECTION_LEVEL_WORDS[plan.inspectionLevel]}</dd>
        <dt className={`${row} text-ink-soft`}>AQL</dt>
        <dd className={row}>{plan.aqlLabel} % nonconforming, normal inspection</dd>
        <dt className={`${row} text-ink-soft`}>Sample size code letter</dt>
        <dd className={row} data-testid="code-letter">
          {plan.codeLetter}
          {plan.arrow !== "none" && <span className="text-ink-soft"> (Table 1 gave {plan.initialCodeLetter}; the table&apos;s arrow points {plan.arrow})</span>}
        </dd>
        <dt className={`${row} text-ink-soft`}>Sample size n</dt>
        <dd className={row} data-testid="sample-size">
          {formatNumber(plan.sampleSize)} cells
        </dd>
        <dt className={`${row} text-ink-soft`}>Acceptance number Ac</dt>
        <dd className={row} data-testid="acceptance-number">
          {plan.acceptanceNumber}
        </dd>
        <dt className={`${row} text-ink-soft`}>Rejection number Re</dt>
        <dd className={row} data-testid="rejection-number">
          {plan.rejectionNumber}
        </dd>
        <dt className={`${row} text-ink-soft`}>Decided by</dt>
        <dd className={row}>
          {acceptanceProcedure ? (
            <>
              the statement of conformity of a reviewed run of{" "}
              <TextLink href={`/procedures/${acceptanceProcedure.id}`} className="font-mono">
                {acceptanceProcedure.code}
              </TextLink>
            </>
          ) : (
            "the statement of conformity of each cell's latest reviewed run, of any procedure"
          )}
        </dd>
        {setBy && (
          <>
            <dt className="py-1 text-ink-soft">Set by</dt>
            <dd className="py-1">
              {setBy.name}, {setBy.at}
            </dd>
          </>
        )}
      </dl>
      {plan.hundredPercent && (
        <p className="max-w-3xl text-sm font-medium" data-testid="hundred-percent">
          The table&apos;s sample ({formatNumber(plan.tableSampleSize)}) reaches the lot size: every cell of the lot is inspected (100 % inspection).
        </p>
      )}
      <div className="max-w-3xl text-sm">
        <p className="font-semibold">How the tables give this plan</p>
        <ol className="list-decimal pl-5">
          {plan.explanation.map((step) => (
            <li key={step}>{step}</li>
          ))}
        </ol>
        <p className="mt-1 text-ink-soft">Source: {plan.source}.</p>
      </div>
    </div>
  );
}
