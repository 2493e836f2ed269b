import { Notice } from "@/components/ui/notice";
import { Cell, HeaderCell, Row, RowHeaderCell, Table, TableHead } from "@/components/ui/table";
import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import type { ClaimVerdict, DatasheetComparison } from "@/lib/analysis/datasheet-comparison";

const VERDICT: Record<ClaimVerdict, { mark: string; tone: string }> = {
  "meets the claim": { mark: "✓", tone: "text-meets" },
  "below the claim": { mark: "✕", tone: "text-deviates" },
  "above the claim": { mark: "✕", tone: "text-deviates" },
  "not measured": { mark: "?", tone: "text-ink-soft" },
};

/** Each datasheet claim beside what was measured, with a verdict in words and why. */
export function DatasheetComparisonTable({ comparison }: { comparison: AnalysisResult<DatasheetComparison> }) {
  if (!comparison.ok) return <Notice tone="problem">{comparison.error.message}</Notice>;
  const { lines, decisionRule } = comparison.value;
  return (
    <div>
      <Table data-testid="datasheet-comparison" className="min-w-[40rem]">
        <TableHead>
          {["Datasheet claim", "Claimed", "Measured", "Verdict", "Why"].map((h) => (
            <HeaderCell key={h} dense>
              {h}
            </HeaderCell>
          ))}
        </TableHead>
        <tbody>
          {lines.map((line) => {
            const v = VERDICT[line.verdict];
            return (
              <Row key={line.key} top>
                <RowHeaderCell dense>
                  {line.claim[0]?.toUpperCase()}
                  {line.claim.slice(1)}
                </RowHeaderCell>
                <Cell dense className="w-36">
                  <span className="whitespace-nowrap">{line.claimed.text}</span>
                  {line.claimOrigin === "derived" && <span className="block text-xs text-ink-soft">derived: {line.claimNote}</span>}
                </Cell>
                <Cell dense className="w-48">{line.measured?.text ?? "nothing on record"}</Cell>
                <Cell dense className={`whitespace-nowrap font-medium ${v.tone}`}>
                  <span aria-hidden="true">{v.mark} </span>
                  {line.verdict}
                </Cell>
                <Cell dense>{line.basis}</Cell>
              </Row>
            );
          })}
        </tbody>
      </Table>
      <p className="mt-2 text-xs text-ink-soft">{decisionRule} Each specimen answers with its latest reviewed 0.2 It result. The step records hold no mass yet, so mass reads “not measured”.</p>
    </div>
  );
}
