import { Notice } from "@/components/ui/notice";
import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import type { RunLogPartView } from "@/db/run-log-parts";
import { describeSender } from "@/lib/runs/log-parts/part-sender";
import { describeDuration, formatPartTime } from "@/lib/runs/log-parts/part-sequence";

function utc(d: Date): string {
  return `${d.toISOString().replace("T", " ").slice(0, 16)} UTC`;
}

/** Every accepted part of the run's log, in order, with the gaps found between them. */
export function LogPartsList({ parts, timeForm }: { parts: RunLogPartView[]; timeForm: "elapsed" | "timestamp" }) {
  const gaps = parts.filter((p) => p.gapBeforeS !== null);
  return (
    <section aria-labelledby="log-parts-heading" className="flex flex-col gap-3" data-testid="log-parts">
      <h2 id="log-parts-heading" className="text-lg font-semibold">
        Log parts ({parts.length})
      </h2>
      <p className="text-sm text-ink-soft">The samples of all parts, in this order, are the run&apos;s log: it is evaluated as one.</p>
      {gaps.map((p) => (
        <Notice key={p.id} tone="caution" title={`Gap before part ${p.number}`}>
          No samples for {describeDuration(p.gapBeforeS as number)} between part {p.number - 1} and part {p.number}. The gap is kept as it was logged;
          judge whether the cell was left as the procedure requires.
        </Notice>
      ))}
      <Table>
        <TableHead>
          <HeaderCell>Part</HeaderCell>
          <HeaderCell>File</HeaderCell>
          <HeaderCell>SHA-256</HeaderCell>
          <HeaderCell>Time span</HeaderCell>
          <HeaderCell className="text-right">Samples</HeaderCell>
          <HeaderCell>Sent</HeaderCell>
        </TableHead>
        <tbody>
          {parts.map((p) => (
            <Row key={p.id} top data-testid="log-part">
              <Cell>{p.number}</Cell>
              <Cell className="break-all">{p.fileName}</Cell>
              <Cell>
                <details>
                  <summary className="cursor-pointer font-mono" title={p.sha256}>
                    {p.sha256.slice(0, 12)}…
                  </summary>
                  <code className="block max-w-56 break-all text-xs">{p.sha256}</code>
                </details>
              </Cell>
              <Cell>
                {formatPartTime(p.firstTimeS, timeForm)} to {formatPartTime(p.lastTimeS, timeForm)}
                <span className="block text-ink-soft">{describeDuration(p.lastTimeS - p.firstTimeS)}</span>
              </Cell>
              <Cell className="text-right">{p.sampleCount.toLocaleString("en-GB")}</Cell>
              <Cell>
                {describeSender(p)}
                <span className="block text-ink-soft">{utc(p.receivedAt)}</span>
              </Cell>
            </Row>
          ))}
        </tbody>
      </Table>
    </section>
  );
}
