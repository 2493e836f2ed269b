import type { ReactNode } from "react";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { ReleaseQueueEntry, RunQueueEntry } from "@/db/queues";
import { formatDateTime } from "@/lib/format-date-time";

/** One queue on the home page: a heading with its count, a short table, or a line saying it is empty. */
function QueueSection({ id, title, empty, count, children }: { id: string; title: string; empty: string; count: number; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="mb-6 rounded border border-rule bg-white p-5" data-testid={id}>
      <h2 id={id} className="mb-2 text-lg font-bold">
        {title} <span className="figures text-base font-normal text-ink-soft">({count})</span>
      </h2>
      {count === 0 ? <p className="text-sm text-ink-soft">{empty}</p> : <div className="overflow-x-auto">{children}</div>}
    </section>
  );
}

export function ReleaseQueue({ entries }: { entries: ReleaseQueueEntry[] }) {
  return (
    <QueueSection id="release-queue" title="Procedures waiting for your release" empty="No procedure version waits for your release." count={entries.length}>
      <Table>
        <TableHead>
          <HeaderCell>Procedure</HeaderCell>
          <HeaderCell>Submitted by</HeaderCell>
          <HeaderCell>Submitted</HeaderCell>
          <HeaderCell>Release</HeaderCell>
        </TableHead>
        <tbody>
          {entries.map((e) => (
            <Row key={`${e.procedureId}-${e.number}`} top>
              <Cell>
                <span className="font-mono">{e.code}</span> version {e.number}: {e.title}
              </Cell>
              <Cell>{e.submittedBy}</Cell>
              <Cell className="figures whitespace-nowrap">{e.submittedAt ? formatDateTime(e.submittedAt) : "—"}</Cell>
              <Cell>
                <TextLink href={`/procedures/${e.procedureId}/versions/${e.number}/release`}>
                  Read and release {e.code} version {e.number}
                </TextLink>
              </Cell>
            </Row>
          ))}
        </tbody>
      </Table>
    </QueueSection>
  );
}

/** A queue of runs, each with the one thing to do next. */
export function RunQueue({
  id,
  title,
  empty,
  entries,
  since,
  showOperator,
  act,
}: {
  id: string;
  title: string;
  empty: string;
  entries: RunQueueEntry[];
  /** What the time column means: "Returned", "Last change", "Accepted". */
  since: string;
  showOperator?: boolean;
  act: (e: RunQueueEntry) => { href: string; label: string };
}) {
  return (
    <QueueSection id={id} title={title} empty={empty} count={entries.length}>
      <Table>
        <TableHead>
          <HeaderCell>Run</HeaderCell>
          <HeaderCell>Specimen</HeaderCell>
          <HeaderCell>Procedure</HeaderCell>
          {showOperator && <HeaderCell>Operator</HeaderCell>}
          <HeaderCell>{since}</HeaderCell>
          <HeaderCell>Next</HeaderCell>
        </TableHead>
        <tbody>
          {entries.map((e) => {
            const next = act(e);
            return (
              <Row key={e.runId} top>
                <Cell className="whitespace-nowrap font-mono">{e.runNumber}</Cell>
                <Cell className="whitespace-nowrap">{e.specimen}</Cell>
                <Cell>{e.procedure}</Cell>
                {showOperator && <Cell>{e.operatorName}</Cell>}
                <Cell className="figures whitespace-nowrap">{formatDateTime(e.changedAt)}</Cell>
                <Cell>
                  <TextLink href={next.href}>
                    {next.label}
                  </TextLink>
                </Cell>
              </Row>
            );
          })}
        </tbody>
      </Table>
    </QueueSection>
  );
}
