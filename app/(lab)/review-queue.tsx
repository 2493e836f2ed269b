import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { ReviewQueueEntry } from "@/db/reviews";
import { formatDateTime } from "@/lib/format-date-time";

/** Runs waiting for an engineer's review, the longest-waiting first; a run you operated goes to another engineer. */
export function ReviewQueue({ entries }: { entries: ReviewQueueEntry[] }) {
  return (
    <section aria-labelledby="review-queue" className="mb-6 rounded border border-rule bg-white p-5">
      <h2 id="review-queue" className="mb-2 text-lg font-bold">
        Runs awaiting review
      </h2>
      {entries.length === 0 ? (
        <p className="text-sm text-ink-soft">No run is waiting for review.</p>
      ) : (
        <Table data-testid="review-queue">
          <TableHead>
            <HeaderCell>Run</HeaderCell>
            <HeaderCell>Specimen</HeaderCell>
            <HeaderCell>Procedure</HeaderCell>
            <HeaderCell>Operator</HeaderCell>
            <HeaderCell>Submitted</HeaderCell>
            <HeaderCell>Review</HeaderCell>
          </TableHead>
          <tbody>
            {entries.map((e) => (
              <Row key={e.runId} top>
                <Cell className="whitespace-nowrap font-mono">{e.runNumber}</Cell>
                <Cell className="whitespace-nowrap">{e.specimen}</Cell>
                <Cell>{e.procedure}</Cell>
                <Cell>{e.operatorName}</Cell>
                <Cell className="figures whitespace-nowrap">{e.submittedAt ? formatDateTime(e.submittedAt) : "—"}</Cell>
                <Cell>
                  {e.operatedByYou ? (
                    <span className="text-ink-soft">you operated this run — another engineer reviews it</span>
                  ) : (
                    <TextLink href={`/runs/${e.runId}/review`}>
                      Review run {e.runNumber}
                    </TextLink>
                  )}
                </Cell>
              </Row>
            ))}
          </tbody>
        </Table>
      )}
    </section>
  );
}
