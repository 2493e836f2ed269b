import Link from "next/link";
import type { SpecimenView } from "@/db/specimens";

/**
 * The specimens registered from a lot, with their tray positions. Once the sample is drawn, a
 * specimen at a position outside it is marked: its results do not enter the lot decision.
 */
export function LotSpecimensTable({ specimens, drawnPositions }: { specimens: readonly SpecimenView[]; drawnPositions: readonly number[] | null }) {
  const drawn = drawnPositions ? new Set(drawnPositions) : null;
  if (specimens.length === 0) return <p className="py-4 text-sm text-ink-soft">No specimens registered from this lot yet.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="figures w-full border-collapse text-sm" data-testid="lot-specimens">
        <thead>
          <tr className="border-b border-rule text-left">
            <th scope="col" className="py-2 pr-3">
              Specimen
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Tray position
            </th>
            {drawn && (
              <th scope="col" className="py-2 pr-3">
                In the drawn sample
              </th>
            )}
            <th scope="col" className="py-2 pr-3">
              Received on
            </th>
            <th scope="col" className="py-2">
              Condition on receipt
            </th>
          </tr>
        </thead>
        <tbody>
          {specimens.map((c) => (
            <tr key={c.id} className="border-b border-rule align-top">
              <td className="py-2 pr-3 whitespace-nowrap">
                <Link href={`/specimens/${c.id}`} className="font-medium text-copper-deep underline">
                  {c.identifier}
                </Link>
              </td>
              <td className="py-2 pr-3 text-right">{c.lotPosition ?? <span className="text-ink-soft">not recorded</span>}</td>
              {drawn && (
                <td className="py-2 pr-3">
                  {c.lotPosition !== null && drawn.has(c.lotPosition) ? (
                    "yes"
                  ) : (
                    <span className="font-medium text-unassessed">
                      <span aria-hidden="true">○ </span>not in the drawn sample
                    </span>
                  )}
                </td>
              )}
              <td className="py-2 pr-3 whitespace-nowrap">{c.receivedOn}</td>
              <td className="py-2">{c.conditionOnReceipt}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
