import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { RunQueueEntry } from "@/db/queues";
import { formatDateTime } from "@/lib/format-date-time";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** Every run of one specimen, oldest first, with its state in words. */
export function SpecimenRuns({ runs }: { runs: RunQueueEntry[] }) {
  return (
    <section aria-labelledby="specimen-runs" className="mt-6">
      <h2 id="specimen-runs" className="mb-2 text-lg font-bold">
        Runs on this specimen
      </h2>
      {runs.length === 0 ? (
        <p className="text-sm text-ink-soft">No run has been started on this specimen.</p>
      ) : (
        <Table data-testid="specimen-runs">
          <TableHead>
            <HeaderCell>Run</HeaderCell>
            <HeaderCell>Procedure</HeaderCell>
            <HeaderCell>Operator</HeaderCell>
            <HeaderCell>State</HeaderCell>
            <HeaderCell>Last change</HeaderCell>
          </TableHead>
          <tbody>
            {runs.map((r) => (
              <Row key={r.runId} top>
                <Cell>
                  <TextLink href={`/runs/${r.runId}`} className="font-mono">
                    {r.runNumber}
                  </TextLink>
                </Cell>
                <Cell>{r.procedure}</Cell>
                <Cell>{r.operatorName}</Cell>
                <Cell>
                  <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
                  {RUN_STATUS_WORDS[r.status].words}
                </Cell>
                <td className="figures whitespace-nowrap py-2">{formatDateTime(r.changedAt)}</td>
              </Row>
            ))}
          </tbody>
        </Table>
      )}
    </section>
  );
}
