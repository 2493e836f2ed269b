import Link from "next/link";
import type { SpecimenView } from "@/db/specimens";

/** Specimens with their cell and lot; `showLot` is off on a lot's own page. */
export function SpecimensTable({ specimens, showLot = true }: { specimens: SpecimenView[]; showLot?: boolean }) {
  return (
    <div className="overflow-x-auto">
      <table className="figures w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left">
            <th className="py-2 pr-3">Specimen</th>
            <th className="py-2 pr-3">Cell</th>
            {showLot && <th className="py-2 pr-3">Lot</th>}
            <th className="py-2 pr-3">Received on</th>
            <th className="py-2">Condition on receipt</th>
          </tr>
        </thead>
        <tbody>
          {specimens.map((c) => (
            <tr key={c.id} className="border-b border-rule align-top">
              <td className="py-2 pr-3">
                <Link href={`/specimens/${c.id}`} className="font-medium text-copper-deep underline">
                  {c.identifier}
                </Link>
              </td>
              <td className="py-2 pr-3">
                {c.specification.maker} {c.specification.model}
              </td>
              {showLot && (
                <td className="py-2 pr-3">
                  {c.lot ? (
                    <Link href={`/lots/${c.lot.id}`} className="text-copper-deep underline">
                      {c.lot.identifier}
                    </Link>
                  ) : (
                    <span className="text-ink-soft">none</span>
                  )}
                </td>
              )}
              <td className="py-2 pr-3 whitespace-nowrap">{c.receivedOn}</td>
              <td className="py-2">{c.conditionOnReceipt}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {specimens.length === 0 && <p className="py-6 text-ink-soft">No specimens match.</p>}
    </div>
  );
}
