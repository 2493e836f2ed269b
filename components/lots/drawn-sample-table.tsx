import { HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { LotSampleMember } from "@/db/lot-sampling";
import { CellResultWords } from "./cell-result-words";

/** The drawn cells in draw order: tray position, the specimen registered there, its reviewed run and result. */
export function DrawnSampleTable({ lotId, members, canRegister }: { lotId: string; members: readonly LotSampleMember[]; canRegister: boolean }) {
  return (
    <Table data-testid="drawn-sample" className="max-w-4xl">
      <TableHead>
        <HeaderCell>
          Order drawn
        </HeaderCell>
        <HeaderCell className="text-right">
          Tray position
        </HeaderCell>
        <HeaderCell>
          Specimen
        </HeaderCell>
        <HeaderCell>
          Reviewed run
        </HeaderCell>
        <HeaderCell>
          Result
        </HeaderCell>
      </TableHead>
      <tbody>
        {members.map((m, k) => (
          <Row key={m.position} top>
            <td className="py-1.5 pr-3 text-ink-soft">{k + 1}</td>
            <th scope="row" className="py-1.5 pr-3 text-right font-semibold">
              {m.position}
            </th>
            <td className="py-1.5 pr-3">
              {m.specimenId ? (
                <TextLink href={`/specimens/${m.specimenId}`}>
                  {m.specimenIdentifier}
                </TextLink>
              ) : canRegister ? (
                <TextLink href={`/specimens/new?lot=${lotId}&position=${m.position}`} aria-label={`Register the cell at tray position ${m.position}`}>
                  Register this cell
                </TextLink>
              ) : (
                <span className="text-ink-soft">not registered yet</span>
              )}
            </td>
            <td className="py-1.5 pr-3">
              {m.runId ? (
                <TextLink href={`/runs/${m.runId}/results`}>
                  {m.runNumber}
                </TextLink>
              ) : (
                <span className="text-ink-soft">none</span>
              )}
            </td>
            <td className="py-1.5">
              <CellResultWords result={m.result} />
            </td>
          </Row>
        ))}
      </tbody>
    </Table>
  );
}
