import { Fragment } from "react";
import { Notice } from "@/components/ui/notice";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import type { RateCapabilityTable } from "@/lib/analysis/rate-capability";
import { formatNumber } from "@/protocols";

const fmt = (v: number | null, decimals: number) => (v === null ? "—" : formatNumber(v, { minDecimals: decimals, maxDecimals: decimals }));

/**
 * Capacity and energy at each discharge current, in A and as a multiple of It, as % of the 0.2 It
 * result and of the rated capacity, with the mean voltage; rows above the cell's rating say so in words.
 */
export function RateCapabilityTableView({ table, emptyWords }: { table: AnalysisResult<RateCapabilityTable>; emptyWords: string }) {
  if (!table.ok) return <Notice title="No rate-capability table yet">{table.error.message === "There are no discharge results for a rate-capability table." ? emptyWords : table.error.message}</Notice>;
  const { rows, referenceNote, basis, itA } = table.value;
  return (
    <div>
      {referenceNote && (
        <div className="mb-2">
          <Notice tone="caution" title="No 0.2 It result">
            There is no discharge at 0.2 It, so the columns “% of 0.2 It” stay empty; capacities are still shown as % of rated.
          </Notice>
        </div>
      )}
      <Table data-testid="rate-capability-table" className="min-w-[42rem]">
        <caption className="sr-only">Rate capability, It = {fmt(itA, 3)} A</caption>
        <TableHead>
          {["Current (A)", "× It", "Results", "Capacity (mAh)", "% of 0.2 It", "% of rated", "Energy (Wh)", "% of 0.2 It energy", "Mean voltage (V)", "Rating"].map((h) => (
            <HeaderCell key={h} dense className={h === "Rating" ? "" : "text-right"}>
              {h}
            </HeaderCell>
          ))}
        </TableHead>
        <tbody>
          {rows.map((r) => (
            <Fragment key={r.currentA}>
              <tr className={`${r.aboveRating ? "" : "border-b"} border-rule ${r.isReference ? "bg-paper-deep" : ""}`}>
                <Cell dense className="text-right">{fmt(r.currentA, 3)}</Cell>
                <Cell dense className="text-right">
                  {formatNumber(r.multipleOfIt, { maxDecimals: 3 })}
                  {r.isReference ? " (reference)" : ""}
                </Cell>
                <Cell dense className="text-right">{r.count}</Cell>
                <Cell dense className="text-right">{fmt(r.capacityMAh, 0)}</Cell>
                <Cell dense className="text-right">{fmt(r.capacityPercentOfReference, 1)}</Cell>
                <Cell dense className="text-right">{fmt(r.capacityPercentOfRated, 1)}</Cell>
                <Cell dense className="text-right">{fmt(r.energyWh, 2)}</Cell>
                <Cell dense className="text-right">{fmt(r.energyPercentOfReference, 1)}</Cell>
                <Cell dense className="text-right">{fmt(r.meanVoltageV, 3)}</Cell>
                <Cell dense className={r.aboveRating ? "font-medium text-deviates" : ""}>
                  {r.aboveRating ? (
                    <span data-testid="above-rating">
                      <span aria-hidden="true">⚠ </span>above the rating
                    </span>
                  ) : (
                    "within"
                  )}
                </Cell>
              </tr>
              {r.aboveRating && (
                <Row>
                  <td colSpan={10} className="px-2 pb-1 text-xs text-deviates">
                    Above the rating: {r.aboveRatingReason}.
                  </td>
                </Row>
              )}
            </Fragment>
          ))}
        </tbody>
      </Table>
      <ul className="mt-2 list-disc pl-5 text-xs text-ink-soft">
        {basis.map((b) => (
          <li key={b}>{b}</li>
        ))}
        <li>Capacity and energy of a row are the mean of its results; the mean voltage is the mean of the results&apos; E / Q.</li>
      </ul>
    </div>
  );
}
