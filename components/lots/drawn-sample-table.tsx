import Link from "next/link";
import type { LotSampleMember } from "@/db/lot-sampling";
import { CellResultWords } from "./cell-result-words";

/** The drawn cells in draw order: tray position, the specimen registered there, its reviewed run and result. */
export function DrawnSampleTable({ lotId, members, canRegister }: { lotId: string; members: readonly LotSampleMember[]; canRegister: boolean }) {
  return (
    <div className="overflow-x-auto">
      <table className="figures w-full max-w-4xl border-collapse text-sm" data-testid="drawn-sample">
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className="py-2 pr-3">
              Order drawn
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Tray position
            </th>
            <th scope="col" className="py-2 pr-3">
              Specimen
            </th>
            <th scope="col" className="py-2 pr-3">
              Reviewed run
            </th>
            <th scope="col" className="py-2">
              Result
            </th>
          </tr>
        </thead>
        <tbody>
          {members.map((m, k) => (
            <tr key={m.position} className="border-b border-rule align-top">
              <td className="py-1.5 pr-3 text-ink-soft">{k + 1}</td>
              <th scope="row" className="py-1.5 pr-3 text-right font-semibold">
                {m.position}
              </th>
              <td className="py-1.5 pr-3">
                {m.specimenId ? (
                  <Link href={`/specimens/${m.specimenId}`} className="text-copper-deep underline">
                    {m.specimenIdentifier}
                  </Link>
                ) : canRegister ? (
                  <Link href={`/specimens/new?lot=${lotId}&position=${m.position}`} className="text-copper-deep underline" aria-label={`Register the cell at tray position ${m.position}`}>
                    Register this cell
                  </Link>
                ) : (
                  <span className="text-ink-soft">not registered yet</span>
                )}
              </td>
              <td className="py-1.5 pr-3">
                {m.runId ? (
                  <Link href={`/runs/${m.runId}/results`} className="text-copper-deep underline">
                    {m.runNumber}
                  </Link>
                ) : (
                  <span className="text-ink-soft">none</span>
                )}
              </td>
              <td className="py-1.5">
                <CellResultWords result={m.result} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
