import { useId } from "react";
import { Row, Table } from "@/components/ui/table";
import type { UncertaintyBudget } from "@/lib/analysis";
import { formatBudgetTable } from "@/lib/conformance";

const COLUMNS: { label: string; hint?: string; numeric?: boolean; width?: string }[] = [
  { label: "Quantity" },
  { label: "Source", width: "min-w-[9rem]" },
  { label: "Stated limit", width: "min-w-[13rem]" },
  { label: "Half-width a", numeric: true },
  { label: "Distribution" },
  { label: "Divisor", numeric: true },
  { label: "u(xᵢ)", hint: "standard uncertainty", numeric: true },
  { label: "Relative u", hint: "u(xᵢ) / |xᵢ|", numeric: true },
  { label: "Sensitivity cᵢ", hint: "relative", numeric: true },
  { label: "Contribution", hint: "|cᵢ| · relative u", numeric: true },
];

const cell = "px-2 py-1 align-top";
const figure = `${cell} whitespace-nowrap text-right`;

/**
 * One uncertainty budget as a table after JCGM 100:2008 clause 8: each source with its stated limit,
 * half-width, distribution and divisor, standard and relative uncertainty, sensitivity and
 * contribution; then the combined standard uncertainty u_c, the coverage factor k and the expanded
 * uncertainty U, absolute and in percent. Scrolls sideways inside its box on a narrow screen.
 */
export function UncertaintyBudgetTable({ budget, title }: { budget: UncertaintyBudget; title: string }) {
  const table = formatBudgetTable(budget);
  const captionId = useId();
  return (
    <figure className="flex flex-col gap-1" data-testid="uncertainty-budget">
      <figcaption id={captionId} className="text-sm">
        <span className="font-semibold">{title}</span>
        <span className="figures">
          {" "}
          · {table.measurand} {table.value} · U = {table.expanded} ({table.expandedPercent}), k = {table.coverageFactor}
        </span>
      </figcaption>
      <p className="text-xs text-ink-soft xl:hidden">Scroll the table sideways for u(xᵢ), relative u, sensitivity and contribution.</p>
      <div className="overflow-x-auto rounded border border-rule bg-white" role="region" aria-labelledby={captionId} tabIndex={0}>
        <Table>
          <thead>
            <tr className="border-b border-rule text-left align-bottom">
              {COLUMNS.map((column) => (
                <th key={column.label} scope="col" className={`px-2 py-1 font-semibold ${column.numeric ? "text-right" : ""} ${column.width ?? ""}`}>
                  {column.label}
                  {column.hint && <span className="block text-xs font-normal text-ink-soft">{column.hint}</span>}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {table.rows.map((row, k) => (
              <Row key={`${k}-${row.quantity}-${row.source}`}>
                <th scope="row" className={`${cell} whitespace-nowrap text-left font-normal`}>
                  {row.quantity}
                </th>
                <td className={cell}>{row.source}</td>
                <td className={`${cell} figures`}>{row.statedLimit}</td>
                <td className={figure}>{row.halfWidth}</td>
                <td className={cell}>{row.distribution}</td>
                <td className={figure}>{row.divisor}</td>
                <td className={figure}>{row.standardUncertainty}</td>
                <td className={figure}>{row.relativeStandardUncertainty}</td>
                <td className={figure}>{row.sensitivity}</td>
                <td className={figure}>{row.contribution}</td>
              </Row>
            ))}
          </tbody>
          {/* The summary sits under the first columns, so it shows without scrolling on a narrow screen. */}
          <tfoot>
            <tr>
              <th scope="row" colSpan={3} className={`${cell} text-left font-semibold`}>
                Combined standard uncertainty u<sub>c</sub>
                <span className="block text-xs font-normal text-ink-soft">root sum of squares of the contributions</span>
              </th>
              <td colSpan={7} className={`${cell} whitespace-nowrap`}>
                {table.combined}
              </td>
            </tr>
            <tr>
              <th scope="row" colSpan={3} className={`${cell} text-left font-semibold`}>
                Coverage factor k
                <span className="block text-xs font-normal text-ink-soft">about 95 % coverage</span>
              </th>
              <td colSpan={7} className={`${cell} whitespace-nowrap`}>
                {table.coverageFactor}
              </td>
            </tr>
            <tr className="border-t border-rule">
              <th scope="row" colSpan={3} className={`${cell} text-left font-semibold`}>
                Expanded uncertainty U = k · u<sub>c</sub>
              </th>
              <td colSpan={7} className={`${cell} whitespace-nowrap font-semibold`}>
                {table.expanded} ({table.expandedPercent})
              </td>
            </tr>
          </tfoot>
        </Table>
      </div>
    </figure>
  );
}
