import { View } from "@react-pdf/renderer";
import { formatBudgetValue, formatFigure, formatPercent, formatQuantityValue } from "./certificate-format";
import type { CertificateUncertainty, RunCertificatePayload } from "./certificate-payload";
import { Heading, styles, Table, Tx } from "./certificate-primitives";

const QUANTITY_SYMBOL: Record<string, string> = { capacity: "Q", energy: "E", "dc-resistance": "R" };

/** The budgets of one step, capacity and energy side by side: their inputs are shared, so each source is listed once. */
function groupBudgets(entries: CertificateUncertainty[]): { key: string; stepLabel: string; entries: CertificateUncertainty[] }[] {
  const groups = new Map<string, { key: string; stepLabel: string; entries: CertificateUncertainty[] }>();
  for (const entry of entries) {
    const key = `${entry.stepId}#${entry.cycle}`;
    const group = groups.get(key) ?? { key, stepLabel: entry.stepLabel, entries: [] };
    group.entries.push(entry);
    groups.set(key, group);
  }
  return [...groups.values()];
}

function BudgetGroup({ stepLabel, entries }: { stepLabel: string; entries: CertificateUncertainty[] }) {
  const rows = new Map<string, { row: CertificateUncertainty["budget"]["rows"][number]; usedIn: string[] }>();
  for (const entry of entries) {
    for (const row of entry.budget.rows) {
      const key = `${row.quantity}|${row.source}|${row.tolerance}|${row.halfWidth}`;
      const seen = rows.get(key) ?? { row, usedIn: [] };
      seen.usedIn.push(`${QUANTITY_SYMBOL[entry.quantity] ?? entry.quantity}${row.sensitivity === 1 ? "" : ` (c = ${formatFigure(row.sensitivity, 2)})`}`);
      rows.set(key, seen);
    }
  }
  return (
    <View style={{ marginBottom: 6 }} wrap={false}>
      <Tx style={{ ...styles.strong, marginBottom: 1 }}>{stepLabel}</Tx>
      {entries.map((u) => (
        <Tx key={u.quantity}>
          {`${u.quantity.replace("-", " ")} ${QUANTITY_SYMBOL[u.quantity] ?? ""} = ${formatQuantityValue(u.budget.value, u.budget.unit)}: U = ±${formatQuantityValue(u.budget.expandedUncertainty, u.budget.unit)} (${formatPercent(u.budget.relativeExpandedUncertainty)}), combined relative standard uncertainty ${formatPercent(u.budget.relativeCombinedStandardUncertainty, 3)}, k = ${formatFigure(u.budget.coverageFactor, 0)}`}
        </Tx>
      ))}
      <View style={{ marginTop: 2 }}>
        <Table
          columns={[
            { title: "Input", width: 9 },
            { title: "Source", width: 27 },
            { title: "Limit", width: 26 },
            { title: "Half-width a", width: 12, align: "right" },
            { title: "Divisor", width: 8, align: "right" },
            { title: "u(x) / x", width: 10, align: "right" },
            { title: "Enters", width: 8, align: "right" },
          ]}
          rows={[...rows.values()].map(({ row, usedIn }) => [
            row.quantity,
            row.source,
            row.tolerance,
            formatBudgetValue(row.halfWidth, row.unit),
            row.distribution === "rectangular" ? "sqrt 3" : formatFigure(row.divisor, 2),
            formatPercent(row.relativeStandardUncertainty, 3),
            usedIn.join(", "),
          ])}
        />
      </View>
    </View>
  );
}

/** Results without a budget, one line per reason: "Charge: capacity, energy; Discharge: capacity". */
function groupNotEvaluated(entries: RunCertificatePayload["uncertaintyNotEvaluated"]): { reason: string; results: string }[] {
  const byReason = new Map<string, Map<string, string[]>>();
  for (const e of entries) {
    const steps = byReason.get(e.reason) ?? new Map<string, string[]>();
    steps.set(e.stepLabel, [...(steps.get(e.stepLabel) ?? []), e.quantity.replace("-", " ")]);
    byReason.set(e.reason, steps);
  }
  return [...byReason].map(([reason, steps]) => ({ reason, results: [...steps].map(([step, quantities]) => `${step} (${quantities.join(", ")})`).join("; ") }));
}

export function UncertaintySection({ payload }: { payload: RunCertificatePayload }) {
  const notEvaluated = payload.uncertaintyNotEvaluated;
  const [first, ...rest] = groupBudgets(payload.uncertainty);
  return (
    <View>
      <View wrap={false}>
        <Heading number={8}>Measurement uncertainty</Heading>
        {first ? (
          <>
            <Tx style={{ ...styles.small, marginBottom: 3 }}>
              Budgets after JCGM 100:2008: each stated limit ±a taken as rectangular (u = a / sqrt 3, 4.3.7), relative standard uncertainties combined as a root sum of squares (5.1.6), expanded with the coverage factor k = 2 for about 95 % coverage (6.3).
            </Tx>
            <BudgetGroup stepLabel={first.stepLabel} entries={first.entries} />
          </>
        ) : (
          <Tx>
            {`Uncertainty not evaluated: the evaluation of this run carried no uncertainty budget.${payload.conformity.decisionRule === "simple acceptance" ? " Under simple acceptance the statement of conformity does not depend on it." : ""}`}
          </Tx>
        )}
      </View>
      {rest.map((group) => (
        <BudgetGroup key={group.key} stepLabel={group.stepLabel} entries={group.entries} />
      ))}
      {groupNotEvaluated(notEvaluated).map(({ reason, results }) => (
        <Tx key={reason} style={styles.small}>{`Not evaluated for ${results}: ${reason}`}</Tx>
      ))}
    </View>
  );
}
