import { Cell, HeaderCell, Row, RowHeaderCell, Table, TableHead } from "@/components/ui/table";
import type { ResultRow } from "@/lib/runs/list-result-rows";

function fixed(v: number | null, digits: number): string {
  return v === null ? "—" : v.toFixed(digits);
}

/** Each step's results with their units: Q in mAh and Ah, E in Wh, mean U in V, R in mΩ. */
export function ResultsTable({ rows }: { rows: ResultRow[] }) {
  return (
    <Table data-testid="results-table">
      <TableHead>
        {["Step", "Duration (h)", "Q (mAh)", "Q (Ah)", "E (Wh)", "Mean U (V)", "End U (V)", "Max T (°C)", "R (mΩ)"].map((h) => (
          <HeaderCell key={h} dense>
            {h}
          </HeaderCell>
        ))}
      </TableHead>
      <tbody>
        {rows.map((r) => (
          <Row key={`${r.stepId}#${r.cycle}`}>
            <RowHeaderCell dense>
              {r.label}
              {r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}
            </RowHeaderCell>
            <Cell dense>{r.durationS === null ? "—" : (r.durationS / 3600).toFixed(3)}</Cell>
            <Cell dense>{fixed(r.capacityMAh, 1)}</Cell>
            <Cell dense>{fixed(r.capacityAh, 4)}</Cell>
            <Cell dense>{fixed(r.energyWh, 3)}</Cell>
            <Cell dense>{fixed(r.meanVoltageV, 3)}</Cell>
            <Cell dense>{fixed(r.endVoltageV, 3)}</Cell>
            <Cell dense>{fixed(r.maxTemperatureC, 1)}</Cell>
            <Cell dense>{fixed(r.resistanceMOhm, 1)}</Cell>
          </Row>
        ))}
      </tbody>
    </Table>
  );
}
