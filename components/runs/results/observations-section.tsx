import { describeObservedValues, type ObservationsResult } from "@/lib/conformance";

const OUTCOME_CLASS: Record<string, string> = {
  conforms: "text-meets",
  "does not conform": "text-deviates",
};

/** Observation steps: what each record shows, then each criterion with the rule, the numbers and its outcome. */
export function ObservationsSection({ observations }: { observations: ObservationsResult }) {
  return (
    <div className="flex flex-col gap-4" data-testid="observations">
      <table className="w-full text-sm">
        <caption className="sr-only">Observations recorded</caption>
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className="py-1 pr-3 font-semibold">Step</th>
            <th scope="col" className="py-1 pr-3 font-semibold">Recorded</th>
          </tr>
        </thead>
        <tbody>
          {observations.records.map((record) => {
            const rows = describeObservedValues(record.observed);
            return (
              <tr key={record.stepId} className="border-b border-rule align-top">
                <th scope="row" className="py-1 pr-3 text-left font-medium">{record.label}</th>
                <td className="figures py-1 pr-3">
                  {rows.length === 0 ? (
                    <span className="text-ink-soft">nothing recorded</span>
                  ) : (
                    <ul>
                      {rows.map((row) => (
                        <li key={row.name}>
                          {row.name}: {row.value}
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {observations.criteria.length > 0 && (
        <>
          <table className="w-full text-sm">
            <caption className="sr-only">Observation criteria</caption>
            <thead>
              <tr className="border-b border-rule text-left">
                <th scope="col" className="py-1 pr-3 font-semibold">Criterion</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Rule</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Observed</th>
                <th scope="col" className="py-1 pr-3 font-semibold">Outcome</th>
              </tr>
            </thead>
            <tbody>
              {observations.criteria.map((criterion) => (
                <tr key={`${criterion.stepId}-${criterion.kind}`} className="border-b border-rule align-top" data-testid="observation-criterion">
                  <th scope="row" className="py-1 pr-3 text-left font-medium">
                    {criterion.kind} on “{criterion.label}”
                  </th>
                  <td className="py-1 pr-3">
                    {criterion.rule}
                    {criterion.source && <span className="block text-xs text-ink-soft">Source: {criterion.source}</span>}
                  </td>
                  <td className="figures py-1 pr-3">{criterion.observed}</td>
                  <td className={`py-1 pr-3 font-medium ${OUTCOME_CLASS[criterion.outcome] ?? ""}`}>{criterion.outcome}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="text-xs text-ink-soft">Decision rule for these criteria: {observations.decisionRule}</p>
        </>
      )}
    </div>
  );
}
