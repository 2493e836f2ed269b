import { summariseEnduranceCycles, type EnduranceResult } from "@/lib/conformance";
import { formatNumber } from "@/protocols";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";

const OUTCOME_CLASS: Record<string, string> = {
  conforms: "text-meets",
  "does not conform": "text-deviates",
};

const STATUS_WORDS: Record<EnduranceResult["status"], string> = {
  stopped: "stopped by the stop criterion",
  completed: "all cycles completed",
  "in progress": "in progress",
};

const mah = (ah: number | null) => (ah === null ? "—" : `${formatNumber(ah * 1000, { maxDecimals: 0 })} mAh`);
const share = (percent: number | null) => (percent === null ? "—" : `${formatNumber(percent, { minDecimals: 1, maxDecimals: 1 })} %`);

/**
 * The endurance block of a run: where the test stands, the stop criterion, the acceptance statement with its
 * decision rule, and the discharge capacity per cycle (the first, every capacity check, the stop cycle and
 * the last; every cycle is in the results as JSON).
 */
export function EnduranceSection({ endurance }: { endurance: EnduranceResult }) {
  const shown = summariseEnduranceCycles(endurance);
  const checks = endurance.checkEveryCycles === null ? "every cycle's capacity counts" : `a capacity check every ${endurance.checkEveryCycles} cycles`;
  return (
    <div className="flex flex-col gap-4" data-testid="endurance">
      <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
        <dt className="text-ink-soft">Block</dt>
        <dd>
          “{endurance.label}”: up to {formatNumber(endurance.maxCycles)} cycles, {checks}; rated capacity {mah(endurance.ratedCapacityAh)}
        </dd>
        <dt className="text-ink-soft">Cycles in the log</dt>
        <dd className="figures">
          {formatNumber(endurance.cyclesLogged)} of {formatNumber(endurance.maxCycles)} ({STATUS_WORDS[endurance.status]})
        </dd>
        <dt className="text-ink-soft">Stop criterion</dt>
        <dd data-testid="endurance-stop">
          capacity below {share(endurance.stopBelowPercentOfRated)} of rated. {endurance.stop.statement}
        </dd>
        <dt className="text-ink-soft">Acceptance</dt>
        <dd data-testid="endurance-acceptance">
          <span className={`font-medium ${OUTCOME_CLASS[endurance.acceptance.outcome] ?? ""}`}>{endurance.acceptance.outcome}</span>. {endurance.acceptance.statement}
          <span className="block text-xs text-ink-soft">Source: {endurance.acceptance.clause}</span>
        </dd>
      </dl>
      {shown.length === 0 ? (
        <EmptyState>The data log shows no cycle of this block yet.</EmptyState>
      ) : (
        <Table data-testid="endurance-cycles">
          <caption className="mb-1 text-left text-xs text-ink-soft">
            Discharge capacity per cycle (Q = ∫|I| dt over each discharge): the first cycle, {endurance.checkEveryCycles === null ? "every 10th" : "each capacity check"}, the stop cycle and the last
            {shown.length < endurance.cycles.length ? `; ${formatNumber(endurance.cycles.length)} cycles in all, each in the results as JSON` : ""}.
          </caption>
          <TableHead>
            <HeaderCell>Cycle</HeaderCell>
            <HeaderCell>Discharge</HeaderCell>
            <HeaderCell className="text-right">Charge capacity</HeaderCell>
            <HeaderCell className="text-right">Discharge capacity</HeaderCell>
            <HeaderCell className="text-right">Of rated</HeaderCell>
          </TableHead>
          <tbody>
            {shown.map((cycle) => (
              <Row key={cycle.cycle} data-testid="endurance-cycle">
                <Cell>
                  {cycle.cycle}
                  {cycle.cycle === endurance.stop.cycle ? " (stop)" : ""}
                </Cell>
                <Cell>{endurance.checkEveryCycles !== null && cycle.capacityCheck ? "capacity check" : "cycle"}</Cell>
                <Cell className="text-right">{mah(cycle.chargeCapacityAh)}</Cell>
                <Cell className="text-right">{mah(cycle.dischargeCapacityAh)}</Cell>
                <Cell className="text-right">{share(cycle.percentOfRated)}</Cell>
              </Row>
            ))}
          </tbody>
        </Table>
      )}
    </div>
  );
}
