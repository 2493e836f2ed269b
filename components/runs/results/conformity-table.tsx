import { Cell, HeaderCell, Row, RowHeaderCell, Table, TableHead } from "@/components/ui/table";
import { formatValue, type AcceptanceResult, type ConformityOutcome, type CriterionConformity } from "@/lib/conformance";
import { explainDecisionRule, nameDecisionRule, type StoredDecisionRule } from "@/protocols";

const OUTCOME: Record<ConformityOutcome, { mark: string; tone: string }> = {
  conforms: { mark: "✓", tone: "text-meets" },
  "conditional pass": { mark: "✓?", tone: "text-unassessed" },
  "conditional fail": { mark: "✕?", tone: "text-deviates" },
  "does not conform": { mark: "✕", tone: "text-deviates" },
  "not decided": { mark: "?", tone: "text-ink-soft" },
};

function showLimit(result: AcceptanceResult | undefined): { limit: string; acceptance: string | null } {
  const limit = result?.limit;
  if (!result || !limit || limit.value === undefined || limit.unit === undefined) return { limit: "—", acceptance: null };
  const sign = limit.side === "lower" ? "≥" : "≤";
  // A guard band moves the limit inward by U (ILAC-G8:09/2019 4.2.2, 4.2.3): the value a result must reach to conform.
  const guarded = result.rule !== "simple acceptance" && result.expandedUncertainty !== null;
  const inward = limit.side === "lower" ? 1 : -1;
  return {
    limit: `${sign} ${formatValue(limit.value, limit.unit)}`,
    acceptance: guarded ? `acceptance limit ${sign} ${formatValue(limit.value + inward * (result.expandedUncertainty ?? 0), limit.unit)}` : null,
  };
}

function showExpanded(result: AcceptanceResult | undefined): string {
  if (!result || result.expandedUncertainty === null || result.measured?.unit === undefined) {
    // Evaluations stored before budgets were made carry no `uncertainty`.
    return result?.uncertainty && !result.uncertainty.evaluated ? "not evaluated" : "—";
  }
  const percent = result.uncertainty?.evaluated ? ` (${(result.uncertainty.relativeExpanded * 100).toFixed(3)} %)` : "";
  return `±${formatValue(result.expandedUncertainty, result.measured.unit)}${percent}`;
}

/**
 * The statement of conformity per criterion, with the decision rule it was made under named above
 * it (ISO/IEC 17025:2017 7.8.6): limit, measured value, expanded uncertainty and outcome in words.
 * Each criterion's full statement is in the verdict's reasons above it.
 */
export function ConformityTable({
  decisionRule,
  conformity,
  acceptance,
}: {
  decisionRule: StoredDecisionRule;
  conformity: readonly CriterionConformity[];
  acceptance: readonly AcceptanceResult[];
}) {
  if (conformity.length === 0) {
    return <p className="text-sm text-ink-soft">The procedure states no acceptance criterion, so no statement of conformity is made.</p>;
  }
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm" data-testid="decision-rule">
        <span className="font-semibold">Decision rule applied: {nameDecisionRule(decisionRule)}</span> (ISO/IEC 17025:2017 7.8.6).{" "}
        <span className="text-ink-soft">{explainDecisionRule(decisionRule)}</span>
      </p>
      <Table data-testid="conformity-table">
        <TableHead>
          {["Criterion", "Cycle", "Limit", "Measured", "Expanded uncertainty U (k = 2)", "Outcome"].map((h) => (
            <HeaderCell key={h} dense>
              {h}
            </HeaderCell>
          ))}
        </TableHead>
        <tbody>
          {conformity.map((entry) => {
            const result = acceptance.find((candidate) => candidate.criterionId === entry.criterionId && candidate.cycle === entry.cycle);
            const o = OUTCOME[entry.outcome];
            const limits = showLimit(result);
            return (
              <Row key={entry.criterionId} top>
                <RowHeaderCell dense className="whitespace-nowrap">
                  {entry.criterionId}
                </RowHeaderCell>
                <Cell dense>{entry.cycle ?? "—"}</Cell>
                <Cell dense className="whitespace-nowrap">
                  {limits.limit}
                  {limits.acceptance && <span className="block text-xs text-ink-soft">{limits.acceptance}</span>}
                </Cell>
                <Cell dense className="whitespace-nowrap">{result?.measured?.value !== undefined && result.measured.unit ? formatValue(result.measured.value, result.measured.unit) : "—"}</Cell>
                <Cell dense className="whitespace-nowrap">{showExpanded(result)}</Cell>
                <Cell dense className={`whitespace-nowrap font-semibold ${o.tone}`}>
                  <span aria-hidden="true">{o.mark} </span>
                  {entry.outcome}
                </Cell>
              </Row>
            );
          })}
        </tbody>
      </Table>
    </div>
  );
}
