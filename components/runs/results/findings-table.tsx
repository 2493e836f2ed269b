"use client";

import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useState } from "react";
import { Row, Table } from "@/components/ui/table";
import type { Finding, FindingOutcome, FindingValue } from "@/lib/conformance";

export type FindingRow = Finding & { stepLabel: string };

const OUTCOME: Record<FindingOutcome, { words: string; mark: string; tone: string }> = {
  meets: { words: "meets", mark: "✓", tone: "text-meets" },
  deviates: { words: "deviates", mark: "✕", tone: "text-deviates" },
  "not assessable": { words: "not assessable", mark: "?", tone: "text-ink-soft" },
};

function showValue(v: FindingValue): string {
  return v.text;
}

const column = createColumnHelper<FindingRow>();
const columns = [
  column.accessor((r) => `${r.stepLabel}${r.cycle && r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}`, { id: "step", header: "Step" }),
  column.accessor("title", { header: "Check" }),
  column.accessor("outcome", {
    header: "Outcome",
    cell: (c) => {
      const o = OUTCOME[c.getValue()];
      // A step run outside the cell's rating is never shown as a plain "meets": it ran there by acknowledgement.
      if (c.row.original.beyondRating && c.getValue() === "meets") {
        return (
          <span className="font-medium text-copper-deep" data-testid="outside-rating">
            <span aria-hidden="true">⚠ </span>outside the rating, acknowledged (safety)
          </span>
        );
      }
      return (
        <span className={o.tone}>
          <span aria-hidden="true">{o.mark} </span>
          {o.words}
          {c.row.original.severity === "caution" ? " (safety)" : ""}
        </span>
      );
    },
  }),
  column.accessor((r) => showValue(r.expected), { id: "expected", header: "Expected" }),
  column.accessor((r) => showValue(r.observed), { id: "observed", header: "Observed" }),
  column.accessor("clause", { header: "Clause" }),
];

/** Every finding of the evaluation, grouped by step in run order, sortable by any column. */
export function FindingsTable({ findings }: { findings: FindingRow[] }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  // TanStack Table keeps its own state; React Compiler skips memoising this component, as intended.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: findings, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <Table data-testid="findings-table">
      <thead>
        {table.getHeaderGroups().map((g) => (
          <tr key={g.id} className="border-b border-rule text-left">
            {g.headers.map((h) => {
              const sorted = h.column.getIsSorted();
              return (
                <th key={h.id} scope="col" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"} className="px-2 py-1">
                  <button type="button" onClick={h.column.getToggleSortingHandler()} className="font-semibold hover:text-copper-deep">
                    {flexRender(h.column.columnDef.header, h.getContext())}
                    <span aria-hidden="true">{sorted === "asc" ? " ▲" : sorted === "desc" ? " ▼" : ""}</span>
                  </button>
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <Row key={row.id} top>
            {row.getVisibleCells().map((cell) => (
              <td key={cell.id} className="px-2 py-1">
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </td>
            ))}
          </Row>
        ))}
      </tbody>
    </Table>
  );
}
