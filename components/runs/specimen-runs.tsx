import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { RunSummary } from "@/db/runs";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** Every run of one specimen, abandoned ones included with their reason, newest first. */
export function SpecimenRuns({ runs }: { runs: RunSummary[] }) {
  return (
    <section aria-labelledby="specimen-runs-heading" className="mt-8 max-w-4xl" data-testid="specimen-runs">
      <h2 id="specimen-runs-heading" className="mb-2 font-serif text-lg font-bold">
        Runs on this specimen
      </h2>
      {runs.length === 0 ? (
        <p className="text-sm text-ink-soft">No run has been planned on this specimen.</p>
      ) : (
        <Table>
          <TableHead>
            <HeaderCell>Run</HeaderCell>
            <HeaderCell>Procedure</HeaderCell>
            <HeaderCell>Status</HeaderCell>
            <HeaderCell>Planned on</HeaderCell>
          </TableHead>
          <tbody>
            {runs.map((r) => (
              <Row key={r.id} top>
                <Cell>
                  <TextLink href={`/runs/${r.id}`} className="font-medium">
                    {r.number}
                  </TextLink>
                </Cell>
                <Cell>
                  {r.procedure.code} v{r.procedure.number} <span className="text-ink-soft">{r.procedure.title}</span>
                </Cell>
                <Cell>
                  <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
                  {RUN_STATUS_WORDS[r.status].words}
                  {r.abandoned && <span className="block text-ink-soft">{r.abandoned.reason}</span>}
                </Cell>
                <Cell className="whitespace-nowrap">{r.createdAt.toISOString().slice(0, 10)}</Cell>
              </Row>
            ))}
          </tbody>
        </Table>
      )}
    </section>
  );
}
