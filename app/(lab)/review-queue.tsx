import Link from "next/link";
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
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm" data-testid="review-queue">
            <thead>
              <tr className="border-b border-rule text-left">
                <th scope="col" className="py-2 pr-3">Run</th>
                <th scope="col" className="py-2 pr-3">Specimen</th>
                <th scope="col" className="py-2 pr-3">Procedure</th>
                <th scope="col" className="py-2 pr-3">Operator</th>
                <th scope="col" className="py-2 pr-3">Submitted</th>
                <th scope="col" className="py-2">Review</th>
              </tr>
            </thead>
            <tbody>
              {entries.map((e) => (
                <tr key={e.runId} className="border-b border-rule align-top">
                  <td className="whitespace-nowrap py-2 pr-3 font-mono">{e.runNumber}</td>
                  <td className="whitespace-nowrap py-2 pr-3">{e.specimen}</td>
                  <td className="py-2 pr-3">{e.procedure}</td>
                  <td className="py-2 pr-3">{e.operatorName}</td>
                  <td className="figures whitespace-nowrap py-2 pr-3">{e.submittedAt ? formatDateTime(e.submittedAt) : "—"}</td>
                  <td className="py-2">
                    {e.operatedByYou ? (
                      <span className="text-ink-soft">you operated this run — another engineer reviews it</span>
                    ) : (
                      <Link href={`/runs/${e.runId}/review`} className="text-copper-deep underline">
                        Review run {e.runNumber}
                      </Link>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
