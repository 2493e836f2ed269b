import { Row, Table, TableHead } from "@/components/ui/table";
import { formatRetentionBasis, formatRetentionReference, formatValue, listRetentionRows, type ChargeRetentionResult } from "@/lib/conformance";
import { formatNumber } from "@/protocols";

/**
 * Charge retention and recovery: each measured capacity and its percentage of the basis the procedure
 * names. These are results, not a statement of conformity: a limit, if any, is a criterion of its own.
 */
export function RetentionTable({ retention }: { retention: ChargeRetentionResult }) {
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm" data-testid="retention-basis">
        {formatRetentionBasis(retention)}
      </p>
      <Table data-testid="retention-table" className="tabular-nums">
        <TableHead>
          {["Result", "Discharge", "Capacity", "Percentage", "Of"].map((h) => (
            <th key={h} scope="col" className="px-2 py-1">
              {h}
            </th>
          ))}
        </TableHead>
        <tbody>
          {listRetentionRows(retention).map(({ name, share }) => (
            <Row key={name} top>
              <th scope="row" className="whitespace-nowrap px-2 py-1 text-left font-normal">
                {name}
              </th>
              <td className="px-2 py-1">{share.label}</td>
              <td className="whitespace-nowrap px-2 py-1">{share.capacityAh === null ? "—" : formatValue(share.capacityAh, "Ah")}</td>
              <td className="whitespace-nowrap px-2 py-1">
                {share.percent === null ? "—" : `${formatNumber(share.percent, { minDecimals: 1, maxDecimals: 1 })} %`}
              </td>
              <td className="px-2 py-1">{share.percent === null ? share.statement : formatRetentionReference(retention)}</td>
            </Row>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
