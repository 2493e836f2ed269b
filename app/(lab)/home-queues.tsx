import type { ReactNode } from "react";
import { DataTable, type DataColumn } from "@/components/ui/data-table";
import { TextLink } from "@/components/ui/text-link";
import type { Page } from "@/db/paginate";
import type { ReleaseQueueEntry, RunQueueEntry } from "@/db/queues";
import type { ReviewQueueEntry } from "@/db/reviews";
import { formatDateTime } from "@/lib/format-date-time";

/**
 * One queue on the home page: a heading with its count, then a page of the queue (each queue pages by its
 * own address parameter, so paging one keeps the others where they were), or a line saying it is empty.
 */
function QueueSection<T>({
  id,
  title,
  empty,
  page,
  kept,
  rowKey,
  columns,
  noun,
}: {
  id: string;
  title: string;
  empty: string;
  page: Page<T>;
  kept: Record<string, string>;
  rowKey: (row: T) => string;
  columns: readonly DataColumn<T>[];
  noun: [string, string];
}) {
  return (
    <section aria-labelledby={id} className="mb-6 rounded border border-rule bg-white p-5" data-testid={id}>
      <h2 id={id} className="mb-2 text-lg font-bold">
        {title} <span className="figures text-base font-normal text-ink-soft">({page.total})</span>
      </h2>
      {page.total === 0 ? (
        <p className="text-sm text-ink-soft">{empty}</p>
      ) : (
        <DataTable rows={page.rows} rowKey={rowKey} columns={columns} path="/" kept={kept} page={page} pageParam={id} pagerLabel={`Pages of ${title.toLowerCase()}`} empty={empty} noun={noun} />
      )}
    </section>
  );
}

/** A run's number kept on one line: a narrow column wraps the words before it, never at its hyphen. */
function RunNumber({ number }: { number: string }) {
  return <span className="whitespace-nowrap">{number}</span>;
}

const submittedAt = (e: { submittedAt: Date | null }) => (e.submittedAt ? formatDateTime(e.submittedAt) : "—");

const RELEASE_COLUMNS: DataColumn<ReleaseQueueEntry>[] = [
  {
    header: "Procedure",
    cell: (e) => (
      <>
        <span className="font-mono">{e.code}</span> version {e.number}: {e.title}
      </>
    ),
  },
  { header: "Submitted by", cell: (e) => e.submittedBy },
  { header: "Submitted", className: "whitespace-nowrap", cell: submittedAt },
  {
    header: "Release",
    cell: (e) => (
      <TextLink href={`/procedures/${e.procedureId}/versions/${e.number}/release`}>
        Read and release {e.code} version {e.number}
      </TextLink>
    ),
  },
];

export function ReleaseQueue({ page, kept }: { page: Page<ReleaseQueueEntry>; kept: Record<string, string> }) {
  return (
    <QueueSection
      id="release-queue"
      title="Procedures waiting for your release"
      empty="No procedure version waits for your release."
      page={page}
      kept={kept}
      rowKey={(e) => `${e.procedureId}-${e.number}`}
      columns={RELEASE_COLUMNS}
      noun={["version", "versions"]}
    />
  );
}

const REVIEW_COLUMNS: DataColumn<ReviewQueueEntry>[] = [
  { header: "Run", className: "whitespace-nowrap font-mono", cell: (e) => e.runNumber },
  { header: "Specimen", className: "whitespace-nowrap", cell: (e) => e.specimen },
  { header: "Procedure", cell: (e) => e.procedure },
  { header: "Operator", cell: (e) => e.operatorName },
  { header: "Submitted", className: "whitespace-nowrap", cell: submittedAt },
  {
    header: "Review",
    cell: (e) =>
      e.operatedByYou ? (
        <span className="text-ink-soft">you operated this run — another engineer reviews it</span>
      ) : (
        <TextLink href={`/runs/${e.runId}/review`}>
          Review run <RunNumber number={e.runNumber} />
        </TextLink>
      ),
  },
];

/** Runs waiting for an engineer's review, the longest-waiting first; a run you operated goes to another engineer. */
export function ReviewQueue({ page, kept }: { page: Page<ReviewQueueEntry>; kept: Record<string, string> }) {
  return (
    <QueueSection
      id="review-queue"
      title="Runs awaiting review"
      empty="No run is waiting for review."
      page={page}
      kept={kept}
      rowKey={(e) => e.runId}
      columns={REVIEW_COLUMNS}
      noun={["run", "runs"]}
    />
  );
}

/** A queue of runs, each with the one thing to do next. */
export function RunQueue({
  id,
  title,
  empty,
  page,
  kept,
  since,
  showOperator,
  act,
}: {
  id: string;
  title: string;
  empty: string;
  page: Page<RunQueueEntry>;
  kept: Record<string, string>;
  /** What the time column means: "Returned", "Last change", "Accepted". */
  since: string;
  showOperator?: boolean;
  /** The next thing to do: where, and its words, which the run's number follows. */
  act: (e: RunQueueEntry) => { href: string; words: string };
}) {
  const columns: DataColumn<RunQueueEntry>[] = [
    { header: "Run", className: "whitespace-nowrap font-mono", cell: (e) => e.runNumber },
    { header: "Specimen", className: "whitespace-nowrap", cell: (e) => e.specimen },
    { header: "Procedure", cell: (e) => e.procedure },
    ...(showOperator ? [{ header: "Operator", cell: (e: RunQueueEntry): ReactNode => e.operatorName }] : []),
    { header: since, className: "whitespace-nowrap", cell: (e) => formatDateTime(e.changedAt) },
    {
      header: "Next",
      cell: (e) => {
        const next = act(e);
        return (
          <TextLink href={next.href}>
            {next.words} <RunNumber number={e.runNumber} />
          </TextLink>
        );
      },
    },
  ];
  return <QueueSection id={id} title={title} empty={empty} page={page} kept={kept} rowKey={(e) => e.runId} columns={columns} noun={["run", "runs"]} />;
}
