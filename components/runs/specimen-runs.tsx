import Link from "next/link";
import type { RunSummary } from "@/db/runs";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** Every run of one specimen, abandoned ones included with their reason, newest first. */
export function SpecimenRuns({ runs }: { runs: RunSummary[] }) {
  return (
    <section aria-labelledby="specimen-runs-heading" className="mt-8 max-w-4xl" data-testid="specimen-runs">
      <h2 id="specimen-runs-heading" className="mb-2 font-serif text-lg font-bold">
        Runs on this specimen
      </h2>
      {runs.length === 0 ? (
        <p className="text-sm text-ink-soft">No run has been planned on this specimen.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="figures w-full border-collapse text-sm">
            <thead>
              <tr className="border-b border-rule text-left">
                <th className="py-2 pr-3">Run</th>
                <th className="py-2 pr-3">Procedure</th>
                <th className="py-2 pr-3">Status</th>
                <th className="py-2">Planned on</th>
              </tr>
            </thead>
            <tbody>
              {runs.map((r) => (
                <tr key={r.id} className="border-b border-rule align-top">
                  <td className="py-2 pr-3">
                    <Link href={`/runs/${r.id}`} className="font-medium text-copper-deep underline">
                      {r.number}
                    </Link>
                  </td>
                  <td className="py-2 pr-3">
                    {r.procedure.code} v{r.procedure.number} <span className="text-ink-soft">{r.procedure.title}</span>
                  </td>
                  <td className="py-2 pr-3">
                    <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
                    {RUN_STATUS_WORDS[r.status].words}
                    {r.abandoned && <span className="block text-ink-soft">{r.abandoned.reason}</span>}
                  </td>
                  <td className="py-2 whitespace-nowrap">{r.createdAt.toISOString().slice(0, 10)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
