import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { SpecimenView } from "@/db/specimens";

/**
 * The specimens registered from a lot, with their tray positions. Once the sample is drawn, a
 * specimen at a position outside it is marked: its results do not enter the lot decision.
 */
export function LotSpecimensTable({ specimens, drawnPositions }: { specimens: readonly SpecimenView[]; drawnPositions: readonly number[] | null }) {
  const drawn = drawnPositions ? new Set(drawnPositions) : null;
  if (specimens.length === 0) return <p className="py-4 text-sm text-ink-soft">No specimens registered from this lot yet.</p>;
  return (
    <Table data-testid="lot-specimens">
      <TableHead>
        <HeaderCell>
          Specimen
        </HeaderCell>
        <HeaderCell className="text-right">
          Tray position
        </HeaderCell>
        {drawn && (
          <HeaderCell>
            In the drawn sample
          </HeaderCell>
        )}
        <HeaderCell>
          Received on
        </HeaderCell>
        <HeaderCell>
          Condition on receipt
        </HeaderCell>
      </TableHead>
      <tbody>
        {specimens.map((c) => (
          <Row key={c.id} top>
            <Cell className="whitespace-nowrap">
              <TextLink href={`/specimens/${c.id}`} className="font-medium">
                {c.identifier}
              </TextLink>
            </Cell>
            <Cell className="text-right">{c.lotPosition ?? <span className="text-ink-soft">not recorded</span>}</Cell>
            {drawn && (
              <Cell>
                {c.lotPosition !== null && drawn.has(c.lotPosition) ? (
                  "yes"
                ) : (
                  <span className="font-medium text-unassessed">
                    <span aria-hidden="true">○ </span>not in the drawn sample
                  </span>
                )}
              </Cell>
            )}
            <Cell className="whitespace-nowrap">{c.receivedOn}</Cell>
            <Cell>{c.conditionOnReceipt}</Cell>
          </Row>
        ))}
      </tbody>
    </Table>
  );
}
