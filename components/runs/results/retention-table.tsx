import { Cell, HeaderCell, Row, RowHeaderCell, Table, TableHead } from "@/components/ui/table";
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
            <HeaderCell key={h} dense>
              {h}
            </HeaderCell>
          ))}
        </TableHead>
        <tbody>
          {listRetentionRows(retention).map(({ name, share }) => (
            <Row key={name} top>
              <RowHeaderCell dense className="whitespace-nowrap">
                {name}
              </RowHeaderCell>
              <Cell dense>{share.label}</Cell>
              <Cell dense className="whitespace-nowrap">
                {share.capacityAh === null ? "—" : formatValue(share.capacityAh, "Ah")}
              </Cell>
              <Cell dense className="whitespace-nowrap">
                {share.percent === null ? "—" : `${formatNumber(share.percent, { minDecimals: 1, maxDecimals: 1 })} %`}
              </Cell>
              <Cell dense>{share.percent === null ? share.statement : formatRetentionReference(retention)}</Cell>
            </Row>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
