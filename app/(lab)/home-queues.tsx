import Link from "next/link";
import type { ReactNode } from "react";
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

const th = "py-2 pr-3";
const td = "py-2 pr-3";

export function ReleaseQueue({ entries }: { entries: ReleaseQueueEntry[] }) {
  return (
    <QueueSection id="release-queue" title="Procedures waiting for your release" empty="No procedure version waits for your release." count={entries.length}>
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className={th}>Procedure</th>
            <th scope="col" className={th}>Submitted by</th>
            <th scope="col" className={th}>Submitted</th>
            <th scope="col" className="py-2">Release</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => (
            <tr key={`${e.procedureId}-${e.number}`} className="border-b border-rule align-top">
              <td className={td}>
                <span className="font-mono">{e.code}</span> version {e.number}: {e.title}
              </td>
              <td className={td}>{e.submittedBy}</td>
              <td className={`figures whitespace-nowrap ${td}`}>{e.submittedAt ? formatDateTime(e.submittedAt) : "—"}</td>
              <td className="py-2">
                <Link href={`/procedures/${e.procedureId}/versions/${e.number}/release`} className="text-copper-deep underline">
                  Read and release {e.code} version {e.number}
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
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
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className={th}>Run</th>
            <th scope="col" className={th}>Specimen</th>
            <th scope="col" className={th}>Procedure</th>
            {showOperator && <th scope="col" className={th}>Operator</th>}
            <th scope="col" className={th}>{since}</th>
            <th scope="col" className="py-2">Next</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => {
            const next = act(e);
            return (
              <tr key={e.runId} className="border-b border-rule align-top">
                <td className={`whitespace-nowrap font-mono ${td}`}>{e.runNumber}</td>
                <td className={`whitespace-nowrap ${td}`}>{e.specimen}</td>
                <td className={td}>{e.procedure}</td>
                {showOperator && <td className={td}>{e.operatorName}</td>}
                <td className={`figures whitespace-nowrap ${td}`}>{formatDateTime(e.changedAt)}</td>
                <td className="py-2">
                  <Link href={next.href} className="text-copper-deep underline">
                    {next.label}
                  </Link>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </QueueSection>
  );
}
