import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { describeObservedValues, type ObservationsResult } from "@/lib/conformance";

const OUTCOME_CLASS: Record<string, string> = {
  conforms: "text-meets",
  "does not conform": "text-deviates",
};

/** Observation steps: what each record shows, then each criterion with the rule, the numbers and its outcome. */
export function ObservationsSection({ observations }: { observations: ObservationsResult }) {
  return (
    <div className="flex flex-col gap-4" data-testid="observations">
      <Table>
        <caption className="sr-only">Observations recorded</caption>
        <TableHead>
          <HeaderCell>Step</HeaderCell>
          <HeaderCell>Recorded</HeaderCell>
        </TableHead>
        <tbody>
          {observations.records.map((record) => {
            const rows = describeObservedValues(record.observed);
            return (
              <Row key={record.stepId} top>
                <HeaderCell scope="row" className="font-medium">
                  {record.label}
                </HeaderCell>
                <Cell>
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
                </Cell>
              </Row>
            );
          })}
        </tbody>
      </Table>
      {observations.criteria.length > 0 && (
        <>
          <Table>
            <caption className="sr-only">Observation criteria</caption>
            <TableHead>
              <HeaderCell>Criterion</HeaderCell>
              <HeaderCell>Rule</HeaderCell>
              <HeaderCell>Observed</HeaderCell>
              <HeaderCell>Outcome</HeaderCell>
            </TableHead>
            <tbody>
              {observations.criteria.map((criterion) => (
                <Row key={`${criterion.stepId}-${criterion.kind}`} top data-testid="observation-criterion">
                  <HeaderCell scope="row" className="font-medium">
                    {criterion.kind} on “{criterion.label}”
                  </HeaderCell>
                  <Cell>
                    {criterion.rule}
                    {criterion.source && <span className="block text-xs text-ink-soft">Source: {criterion.source}</span>}
                  </Cell>
                  <Cell>{criterion.observed}</Cell>
                  <Cell className={`font-medium ${OUTCOME_CLASS[criterion.outcome] ?? ""}`}>{criterion.outcome}</Cell>
                </Row>
              ))}
            </tbody>
          </Table>
          <p className="text-xs text-ink-soft">Decision rule for these criteria: {observations.decisionRule}</p>
        </>
      )}
    </div>
  );
}
