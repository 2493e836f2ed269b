import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { SpecimenView } from "@/db/specimens";

/** Specimens with their cell and lot; `showLot` is off on a lot's own page. */
export function SpecimensTable({ specimens, showLot = true }: { specimens: SpecimenView[]; showLot?: boolean }) {
  return (
    <>
      <Table>
        <TableHead>
          <HeaderCell>Specimen</HeaderCell>
          <HeaderCell>Cell</HeaderCell>
          {showLot && <HeaderCell>Lot</HeaderCell>}
          <HeaderCell>Received on</HeaderCell>
          <HeaderCell>Condition on receipt</HeaderCell>
        </TableHead>
        <tbody>
          {specimens.map((c) => (
            <Row key={c.id} top>
              <Cell>
                <TextLink href={`/specimens/${c.id}`} className="font-medium">
                  {c.identifier}
                </TextLink>
              </Cell>
              <Cell>
                {c.specification.maker} {c.specification.model}
              </Cell>
              {showLot && (
                <Cell>
                  {c.lot ? (
                    <TextLink href={`/lots/${c.lot.id}`}>
                      {c.lot.identifier}
                    </TextLink>
                  ) : (
                    <span className="text-ink-soft">none</span>
                  )}
                </Cell>
              )}
              <Cell className="whitespace-nowrap">{c.receivedOn}</Cell>
              <Cell>{c.conditionOnReceipt}</Cell>
            </Row>
          ))}
        </tbody>
      </Table>
      {specimens.length === 0 && <EmptyState>No specimens match.</EmptyState>}
    </>
  );
}
