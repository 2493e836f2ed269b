import Link from "next/link";
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
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm" data-testid="specimen-runs">
            <thead>
              <tr className="border-b border-rule text-left">
                <th scope="col" className="py-2 pr-3">Run</th>
                <th scope="col" className="py-2 pr-3">Procedure</th>
                <th scope="col" className="py-2 pr-3">Operator</th>
                <th scope="col" className="py-2 pr-3">State</th>
                <th scope="col" className="py-2">Last change</th>
              </tr>
            </thead>
            <tbody>
              {runs.map((r) => (
                <tr key={r.runId} className="border-b border-rule align-top">
                  <td className="py-2 pr-3">
                    <Link href={`/runs/${r.runId}`} className="font-mono text-copper-deep underline">
                      {r.runNumber}
                    </Link>
                  </td>
                  <td className="py-2 pr-3">{r.procedure}</td>
                  <td className="py-2 pr-3">{r.operatorName}</td>
                  <td className="py-2 pr-3">
                    <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
                    {RUN_STATUS_WORDS[r.status].words}
                  </td>
                  <td className="figures whitespace-nowrap py-2">{formatDateTime(r.changedAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
