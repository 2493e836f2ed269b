import { Cell, HeaderCell, Row, Table, TableHead } from "@/components/ui/table";
import { TextLink } from "@/components/ui/text-link";
import type { CellSpecificationView } from "@/db/cell-specifications";
import type { DischargeResultRow } from "@/db/discharge-results";
import type { LotView } from "@/db/lots";
import { computeMultipleOfIt, formatDischargeKey, listMultiplesOfIt, MAX_OVERLAID, type CompareQuery } from "@/lib/lots/results/compare-selection";
import { isAboveRating } from "@/lib/lots/results/summarise-results";
import { formatNumber } from "@/protocols";
import { SelectField } from "@/components/ui/select-field";

/** Most rows the list shows at once; the filters narrow it. */
const MAX_LISTED = 200;


/**
 * The list to choose from: filters by cell specification, lot, specimen and current, and a tick per
 * discharge. A plain GET form, so the choice lands in the address and the page works without script.
 */
export function DischargeChooser({
  query,
  specifications,
  lots,
  pool,
  listed,
  chosenKeys,
}: {
  query: CompareQuery;
  specifications: CellSpecificationView[];
  lots: LotView[];
  pool: DischargeResultRow[];
  listed: DischargeResultRow[];
  chosenKeys: string[];
}) {
  const specimens = [...new Map(pool.map((r) => [r.specimenId, r.specimenIdentifier])).entries()].sort((a, b) => a[1].localeCompare(b[1]));
  const multiples = listMultiplesOfIt(pool);
  const shown = listed.slice(0, MAX_LISTED);
  const shownKeys = new Set(shown.map(formatDischargeKey));
  const chosen = new Set(chosenKeys);
  return (
    <section aria-labelledby="choose-heading">
      <h2 id="choose-heading" className="mb-2 text-lg font-bold">
        Choose discharges
      </h2>
      <form action="/compare" method="get" className="flex flex-col gap-3">
        <fieldset className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <legend className="sr-only">Filters</legend>
          <SelectField filter label="Cell specification" name="spec" defaultValue={query.specificationId ?? ""}>
            <option value="">any</option>
            {specifications.map((s) => (
              <option key={s.id} value={s.id}>
                {s.maker} {s.model}
              </option>
            ))}
          </SelectField>
          <SelectField filter label="Lot" name="lot" defaultValue={query.lotId ?? ""}>
            <option value="">any</option>
            {lots.map((l) => (
              <option key={l.id} value={l.id}>
                {l.identifier}
              </option>
            ))}
          </SelectField>
          <SelectField filter label="Specimen" name="specimen" defaultValue={query.specimenId ?? ""}>
            <option value="">any</option>
            {specimens.map(([id, identifier]) => (
              <option key={id} value={id}>
                {identifier}
              </option>
            ))}
          </SelectField>
          <SelectField filter label="Current" name="current" defaultValue={query.multipleOfIt === undefined ? "" : String(query.multipleOfIt)}>
            <option value="">any</option>
            {multiples.map((m) => (
              <option key={m} value={String(m)}>
                {formatNumber(m, { maxDecimals: 2 })} It
              </option>
            ))}
          </SelectField>
        </fieldset>
        {chosenKeys
          .filter((k) => !shownKeys.has(k))
          .map((k) => (
            <input key={k} type="hidden" name="d" value={k} />
          ))}
        <div className="flex flex-wrap items-center gap-3">
          <button type="submit" className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
            Overlay the ticked discharges
          </button>
          <span className="text-sm text-ink-soft">The filters apply too. At most {MAX_OVERLAID} at once.</span>
          <TextLink href="/compare" className="text-sm">
            Start again
          </TextLink>
        </div>
        {shown.length === 0 ? (
          <p className="text-sm text-ink-soft">No reviewed discharges match these filters.</p>
        ) : (
          <Table data-testid="discharge-list" className="min-w-[44rem]">
            <caption className="mb-1 text-left text-ink-soft">
              {listed.length > MAX_LISTED ? `The first ${MAX_LISTED} of ${listed.length} reviewed discharges; narrow the filters to see the rest.` : `${listed.length} reviewed discharges.`}
            </caption>
            <TableHead>
              {["Overlay", "Run", "Specimen", "Lot", "Step", "Current", "Capacity (mAh)"].map((h) => (
                <HeaderCell key={h} dense>
                  {h}
                </HeaderCell>
              ))}
            </TableHead>
            <tbody>
              {shown.map((r) => {
                const key = formatDischargeKey(r);
                const id = `d-${key}`;
                return (
                  <Row key={key}>
                    <Cell dense>
                      <input id={id} type="checkbox" name="d" value={key} defaultChecked={chosen.has(key)} className="h-4 w-4 accent-copper" />
                    </Cell>
                    <Cell dense className="whitespace-nowrap">
                      <label htmlFor={id}>{r.runNumber}</label>
                    </Cell>
                    <Cell dense className="whitespace-nowrap">{r.specimenIdentifier}</Cell>
                    <Cell dense className="whitespace-nowrap">{r.lotIdentifier ?? "none"}</Cell>
                    <Cell dense>
                      {r.stepLabel}
                      {r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}
                    </Cell>
                    <Cell dense className="whitespace-nowrap">
                      {formatNumber(computeMultipleOfIt(r), { maxDecimals: 3 })} It ({formatNumber(r.currentA, { minDecimals: 3, maxDecimals: 3 })} A)
                      {isAboveRating(r, r.rating.maxContinuousDischargeCurrentA) ? " ⚠ above the rating" : ""}
                    </Cell>
                    <Cell dense className="text-right">{formatNumber(r.capacityAh * 1000, { maxDecimals: 0 })}</Cell>
                  </Row>
                );
              })}
            </tbody>
          </Table>
        )}
      </form>
    </section>
  );
}
