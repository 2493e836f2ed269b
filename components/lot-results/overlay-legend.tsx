import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { PlainLink } from "@/components/ui/text-link";
import type { DischargeResultRow } from "@/db/discharge-results";
import { computeMultipleOfIt, formatDischargeKey } from "@/lib/lots/results/compare-selection";
import type { OverlayStyle } from "@/lib/lots/results/overlay-style";
import { isAboveRating } from "@/lib/lots/results/summarise-results";
import { formatNumber } from "@/protocols";

function Swatch({ style }: { style: OverlayStyle }) {
  return (
    <svg width="36" height="10" aria-hidden="true" className="inline-block align-middle">
      <line x1="1" y1="5" x2="35" y2="5" stroke={style.colour} strokeWidth="2.5" strokeDasharray={style.dash.join(" ") || undefined} />
    </svg>
  );
}

/** The legend of the overlay: which curve is which run, specimen and current, with its numbers. */
export function OverlayLegend({ rows, styles }: { rows: DischargeResultRow[]; styles: Record<string, OverlayStyle> }) {
  return (
    <Table data-testid="overlay-legend" className="min-w-[46rem]">
      <caption className="mb-1 text-left font-semibold">Legend</caption>
      <TableHead>
        {["Curve", "Run", "Specimen", "Cell", "Current", "Capacity (mAh)", "Energy (Wh)", "Mean voltage (V)"].map((h) => (
          <HeaderCell key={h} dense>
            {h}
          </HeaderCell>
        ))}
      </TableHead>
      <tbody>
        {rows.map((r) => {
          const key = formatDischargeKey(r);
          const style = styles[key]!;
          return (
            <Row key={key}>
              <Cell dense className="whitespace-nowrap">
                <Swatch style={style} /> <span className="text-xs text-ink-soft">{style.pattern}</span>
              </Cell>
              <Cell dense>
                <PlainLink href={`/runs/${r.runId}/results`}>
                  {r.runNumber}
                </PlainLink>
                <span className="block text-xs text-ink-soft">
                  {r.procedureCode}: {r.stepLabel}
                  {r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}
                </span>
              </Cell>
              <Cell dense>{r.specimenIdentifier}</Cell>
              <Cell dense>{r.specificationName}</Cell>
              <Cell dense className="whitespace-nowrap">
                {formatNumber(computeMultipleOfIt(r), { maxDecimals: 3 })} It ({formatNumber(r.currentA, { minDecimals: 3, maxDecimals: 3 })} A)
                {isAboveRating(r, r.rating.maxContinuousDischargeCurrentA) && <span className="block text-xs text-deviates">⚠ above the rating</span>}
              </Cell>
              <Cell dense className="text-right">{formatNumber(r.capacityAh * 1000, { maxDecimals: 0 })}</Cell>
              <Cell dense className="text-right">{formatNumber(r.energyWh, { minDecimals: 2, maxDecimals: 2 })}</Cell>
              <Cell dense className="text-right">{formatNumber(r.meanVoltageV, { minDecimals: 3, maxDecimals: 3 })}</Cell>
            </Row>
          );
        })}
      </tbody>
    </Table>
  );
}
