import { Row, Table, TableHead } from "@/components/ui/table";
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
          <th key={h} scope="col" className="px-2 py-1">
            {h}
          </th>
        ))}
      </TableHead>
      <tbody>
        {rows.map((r) => (
          <Row key={`${r.stepId}#${r.cycle}`}>
            <th scope="row" className="px-2 py-1 text-left font-normal">
              {r.label}
              {r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}
            </th>
            <td className="px-2 py-1">{r.durationS === null ? "—" : (r.durationS / 3600).toFixed(3)}</td>
            <td className="px-2 py-1">{fixed(r.capacityMAh, 1)}</td>
            <td className="px-2 py-1">{fixed(r.capacityAh, 4)}</td>
            <td className="px-2 py-1">{fixed(r.energyWh, 3)}</td>
            <td className="px-2 py-1">{fixed(r.meanVoltageV, 3)}</td>
            <td className="px-2 py-1">{fixed(r.endVoltageV, 3)}</td>
            <td className="px-2 py-1">{fixed(r.maxTemperatureC, 1)}</td>
            <td className="px-2 py-1">{fixed(r.resistanceMOhm, 1)}</td>
          </Row>
        ))}
      </tbody>
    </Table>
  );
}
