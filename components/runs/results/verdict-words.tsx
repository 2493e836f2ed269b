import type { RunVerdict } from "@/lib/conformance";
import { nameDecisionRule, type StoredDecisionRule } from "@/protocols";

const FOLLOWED: Record<RunVerdict["procedureFollowed"], string> = { yes: "yes", no: "no", "not decided": "not decided" };

/** The two answers of an evaluation, in words, with the decision rule the specimen's statement was made under when given. */
export function VerdictWords({ verdict, decisionRule }: { verdict: RunVerdict; decisionRule?: StoredDecisionRule }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="verdict">
      <dt className="font-semibold">Procedure followed</dt>
      <dd>{FOLLOWED[verdict.procedureFollowed]}</dd>
      <dt className="font-semibold">Specimen</dt>
      <dd>{verdict.specimenConforms}</dd>
      {decisionRule && (
        <>
          <dt className="font-semibold">Decision rule</dt>
          <dd>{nameDecisionRule(decisionRule)}</dd>
        </>
      )}
      {verdict.beyondRating && (
        <>
          <dt className="font-semibold">Note</dt>
          <dd>some step ran outside the cell&apos;s rating; its results are marked so</dd>
        </>
      )}
      {verdict.reasons.length > 0 && (
        <>
          <dt className="font-semibold">Why</dt>
          <dd>
            <ul className="list-disc pl-5">
              {verdict.reasons.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          </dd>
        </>
      )}
    </dl>
  );
}
