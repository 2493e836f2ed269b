import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import type { FindingOutcome } from "@/lib/conformance";
import type { FindingLine } from "@/lib/runs/group-findings";

const OUTCOME: Record<FindingOutcome, { words: string; mark: string; tone: string }> = {
  meets: { words: "meets", mark: "✓", tone: "text-meets" },
  deviates: { words: "deviates", mark: "✕", tone: "text-deviates" },
  "not assessable": { words: "not assessable", mark: "?", tone: "text-ink-soft" },
};

/** The findings of one step (or of the run as a whole): drawn on the server for an open group, in the browser for one opened later. */
export function FindingLinesTable({ lines }: { lines: FindingLine[] }) {
  return (
    <Table>
      <TableHead>
        <HeaderCell>Check</HeaderCell>
        <HeaderCell>Outcome</HeaderCell>
        <HeaderCell>Expected</HeaderCell>
        <HeaderCell>Observed</HeaderCell>
        <HeaderCell>Clause</HeaderCell>
      </TableHead>
      <tbody>
        {lines.map((f) => (
          <Row key={f.id} top>
            <Cell>{f.title}</Cell>
            <Cell>
              <FindingOutcomeWords line={f} />
            </Cell>
            <Cell>{f.expected}</Cell>
            <Cell>{f.observed}</Cell>
            <Cell>{f.clause}</Cell>
          </Row>
        ))}
      </tbody>
    </Table>
  );
}

function FindingOutcomeWords({ line }: { line: FindingLine }) {
  // A step run outside the cell's rating is never shown as a plain "meets": it ran there by acknowledgement.
  if (line.beyondRating && line.outcome === "meets") {
    return (
      <span className="font-medium text-copper-deep" data-testid="outside-rating">
        <span aria-hidden="true">⚠ </span>outside the rating, acknowledged (safety)
      </span>
    );
  }
  const o = OUTCOME[line.outcome];
  return (
    <span className={o.tone}>
      <span aria-hidden="true">{o.mark} </span>
      {o.words}
      {line.safety ? " (safety)" : ""}
    </span>
  );
}
