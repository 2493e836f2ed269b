import { Notice } from "@/components/ui/notice";
import { Cell, HeaderCell, Row, RowHeaderCell, Table, TableHead } from "@/components/ui/table";
import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import type { CurrentSummary, StatisticsSummary } from "@/lib/lots/results/summarise-results";
import { cplFormula, cplSource, type ResultsDescription } from "@/lib/statistics";
import { formatNumber } from "@/protocols";
import { HistogramChart, type HistogramMarker } from "./histogram-chart";

const fmt = (v: number, decimals: number) => formatNumber(v, { minDecimals: decimals, maxDecimals: decimals });

/** Below this many results a histogram shows little more than the values themselves, so the values are listed instead. */
const MIN_FOR_HISTOGRAM = 5;

function listValues(group: CurrentSummary, decimals: number): string {
  return group.capacitiesMah.map((v) => `${fmt(v, decimals)} mAh`).join(", ");
}

function describeShare(d: ResultsDescription, decimals: number): string {
  if (!d.rated) return "—";
  const { countAtOrAbove, shareAtOrAbove, rated } = d.rated;
  return `${countAtOrAbove} of ${d.count} (${formatNumber(shareAtOrAbove * 100, { maxDecimals: 0 })} %) at or above ${fmt(rated, decimals)} ${d.unit}`;
}

function describeCapability(d: ResultsDescription): string {
  if (!d.capability) return "— (no lower limit)";
  const { cpl, countBelow, note } = d.capability;
  const below = `${countBelow} below the minimum`;
  return cpl === null ? `not defined (${note ?? "s = 0"}); ${below}` : `${fmt(cpl, 2)}; ${below}`;
}

function QuantityRow({ label, result, decimals }: { label: string; result: AnalysisResult<ResultsDescription>; decimals: number }) {
  if (!result.ok) {
    return (
      <Row>
        <RowHeaderCell dense>
          {label}
        </RowHeaderCell>
        <Cell colSpan={7} dense className="text-ink-soft">
          {result.error.message}
        </Cell>
      </Row>
    );
  }
  const d = result.value;
  return (
    <Row>
      <RowHeaderCell dense>
        {label}
      </RowHeaderCell>
      <Cell dense className="text-right">{d.count}</Cell>
      <Cell dense className="text-right">{fmt(d.mean, decimals)}</Cell>
      <Cell dense className="text-right">{fmt(d.standardDeviation, decimals + 1)}</Cell>
      <Cell dense className="text-right">{fmt(d.min, decimals)}</Cell>
      <Cell dense className="text-right">{fmt(d.max, decimals)}</Cell>
      <Cell dense>{describeShare(d, decimals)}</Cell>
      <Cell dense>{describeCapability(d)}</Cell>
    </Row>
  );
}

function CurrentSection({ group, summary }: { group: CurrentSummary; summary: StatisticsSummary }) {
  const heading = `${formatNumber(group.multipleOfIt, { maxDecimals: 3 })} It (${fmt(group.currentA, 3)} A)`;
  const capacityMarkers: HistogramMarker[] = group.isReferenceCurrent
    ? [
        ...(summary.minimumCapacityMah !== null ? [{ value: summary.minimumCapacityMah, label: "minimum" }] : []),
        { value: summary.ratedCapacityMah, label: "rated" },
      ]
    : [];
  const id = `current-${String(group.multipleOfIt).replace(".", "-")}`;
  return (
    <section aria-labelledby={id} className="rounded border border-rule bg-white p-4" data-testid="current-statistics">
      <h3 id={id} className="text-base font-bold">
        At {heading}
        {group.isReferenceCurrent && <span className="font-normal text-ink-soft"> · the rated-capacity current</span>}
        {group.aboveRating && <span className="font-normal text-deviates"> · ⚠ includes results above the cell&apos;s rating</span>}
      </h3>
      <p className="mb-2 text-sm text-ink-soft">
        {group.count} result{group.count === 1 ? "" : "s"} from {group.specimenCount} specimen{group.specimenCount === 1 ? "" : "s"}
        {group.note ? `. ${group.note}` : "."}
      </p>
      {group.count < 2 && (
        <div className="mb-3">
          <Notice tone="caution" title="Fewer than two results">
            Statistics at this current need at least two results; there is only one. Nothing is computed or stored for it until a second result is reviewed.
          </Notice>
        </div>
      )}
      <Table data-testid="statistics-table" className="min-w-[44rem]">
        <TableHead>
          {["Quantity", "n", "Mean", "s", "Min", "Max", "At or above rated", "Cpl against the minimum"].map((h) => (
            <HeaderCell key={h} dense className={["n", "Mean", "s", "Min", "Max"].includes(h) ? "text-right" : ""}>
              {h}
            </HeaderCell>
          ))}
        </TableHead>
        <tbody>
          <QuantityRow label="Capacity (mAh)" result={group.capacity} decimals={0} />
          <QuantityRow label="Energy (Wh)" result={group.energy} decimals={2} />
        </tbody>
      </Table>
      {group.count >= 2 && group.count < MIN_FOR_HISTOGRAM && (
        <p className="mt-2 text-xs text-ink-soft">
          No histogram below {MIN_FOR_HISTOGRAM} results; the capacities are {listValues(group, 0)}.
        </p>
      )}
      {group.count >= MIN_FOR_HISTOGRAM && group.capacityHistogram.ok && group.energyHistogram.ok && (
        <div className="mt-3 grid gap-4 lg:grid-cols-2">
          <HistogramChart histogram={group.capacityHistogram.value} quantity="Capacity" unit="mAh" decimals={0} markers={capacityMarkers} testId="capacity-histogram" />
          <HistogramChart
            histogram={group.energyHistogram.value}
            quantity="Energy"
            unit="Wh"
            decimals={2}
            markers={group.isReferenceCurrent ? [{ value: summary.ratedEnergyWh, label: "rated" }] : []}
            testId="energy-histogram"
          />
        </div>
      )}
    </section>
  );
}

/** Capacity and energy at each test current: the statistics, the capability index and a histogram of each. */
export function StatisticsByCurrent({ summary }: { summary: StatisticsSummary }) {
  if (summary.problem) {
    return <Notice title="No statistics yet">{summary.problem} Results count once their run is accepted by a reviewer.</Notice>;
  }
  return (
    <div className="flex flex-col gap-4">
      {summary.currents.map((group) => (
        <CurrentSection key={group.currentA} group={group} summary={summary} />
      ))}
      <div className="text-xs text-ink-soft">
        <p>
          s is the sample standard deviation (n − 1). {cplFormula}, with LSL the minimum capacity{" "}
          {summary.minimumCapacityMah !== null ? `(${fmt(summary.minimumCapacityMah, 0)} mAh)` : "(none on the datasheet)"}: {cplSource}. Cpl assumes roughly normal
          results; with few results it is a rough figure.
        </p>
        <p>
          Rated and minimum capacity are defined at 0.2 It (IEC 61960-3); the rated energy {fmt(summary.ratedEnergyWh, 2)} Wh is the {summary.ratedEnergyBasis}, since the
          datasheet record holds no energy. Results count when they lie within 2 % of a group&apos;s lowest current.
        </p>
      </div>
    </div>
  );
}
