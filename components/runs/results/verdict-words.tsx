import type { RunVerdict } from "@/lib/conformance";
import { nameDecisionRule, type StoredDecisionRule } from "@/protocols";

const FOLLOWED: Record<RunVerdict["procedureFollowed"], string> = {
  yes: "yes: every step as the procedure asks",
  no: "no: some step deviates from the procedure (see the findings)",
  "not decided": "not decided: some step could not be assessed",
};

/** The verdict in one sentence, for a notice: "The procedure was not followed; the specimen conforms." */
export function describeVerdictInline(verdict: Pick<RunVerdict, "procedureFollowed" | "specimenConforms">): string {
  const followed =
    verdict.procedureFollowed === "yes" ? "the procedure was followed" : verdict.procedureFollowed === "no" ? "the procedure was not followed" : "whether the procedure was followed is not decided";
  const specimen = verdict.specimenConforms === "not decided" ? "whether the specimen conforms is not decided" : `the specimen ${verdict.specimenConforms}`;
  return `${followed[0]!.toUpperCase()}${followed.slice(1)}; ${specimen}.`;
}

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
