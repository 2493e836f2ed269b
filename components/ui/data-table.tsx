import Link from "next/link";
import type { ReactNode } from "react";
import { listHref, type SortDirection } from "@/lib/lists/list-params";
import { Cell, EmptyState, HeaderCell, Row, Table, TableHead } from "./table";

export interface DataColumn<T, S extends string = string> {
  header: string;
  cell: (row: T) => ReactNode;
  /** The list's sort key for this column; a column without one cannot be sorted. */
  sort?: S;
  /** The first way a click on this header sorts: dates and counts read best newest/largest first. */
  firstDirection?: SortDirection;
  /** Classes for the column's cells (the header keeps the table's own type). */
  className?: string;
}

export interface DataPage {
  page: number;
  pageCount: number;
  total: number;
}

/**
 * A list sorted and paged on the server: headers are links that keep the filters in the address,
 * an empty list says so in words, and the foot says "Page X of Y" with links either side.
 */
export function DataTable<T, S extends string>({
  rows,
  rowKey,
  columns,
  path,
  kept,
  sort,
  page,
  empty,
  noun,
  rowProps,
  testId,
  pageParam = "page",
  pagerLabel = "Pages",
}: {
  rows: readonly T[];
  rowKey: (row: T) => string;
  columns: readonly DataColumn<T, S>[];
  /** The page's own path; sort and page links point at it. */
  path: string;
  /** The address's other parameters (filters), kept by every link. */
  kept: Record<string, string>;
  sort?: { key: S; direction: SortDirection };
  page?: DataPage;
  empty: string;
  /** What one row is, singular and plural, for the count in the foot. */
  noun?: [string, string];
  rowProps?: (row: T) => Record<string, string | undefined>;
  testId?: string;
  /** The address parameter that holds this list's page: several lists on one page each page by their own. */
  pageParam?: string;
  /** The pager's name for a screen reader, distinct when one page holds several lists. */
  pagerLabel?: string;
}) {
  return (
    <div data-testid={testId}>
      <Table>
        <TableHead>
          {columns.map((c) => (
            <SortableHeader key={c.header} column={c} path={path} kept={kept} sort={sort} />
          ))}
        </TableHead>
        <tbody>
          {rows.map((r) => (
            <Row key={rowKey(r)} {...rowProps?.(r)}>
              {columns.map((c) => (
                <Cell key={c.header} className={c.className}>
                  {c.cell(r)}
                </Cell>
              ))}
            </Row>
          ))}
        </tbody>
      </Table>
      {rows.length === 0 && <EmptyState>{empty}</EmptyState>}
      {page && page.total > 0 && <Pager page={page} path={path} kept={kept} noun={noun} param={pageParam} label={pagerLabel} />}
    </div>
  );
}

function SortableHeader<T, S extends string>({
  column,
  path,
  kept,
  sort,
}: {
  column: DataColumn<T, S>;
  path: string;
  kept: Record<string, string>;
  sort?: { key: S; direction: SortDirection };
}) {
  if (!column.sort) return <HeaderCell>{column.header}</HeaderCell>;
  const active = sort?.key === column.sort;
  const first = column.firstDirection ?? "asc";
  const next: SortDirection = active ? (sort.direction === "asc" ? "desc" : "asc") : first;
  const href = listHref(path, kept, { sort: column.sort, dir: next, page: undefined });
  return (
    <HeaderCell aria-sort={active ? (sort.direction === "asc" ? "ascending" : "descending") : "none"}>
      <Link href={href} className="inline-flex items-center gap-1 hover:text-copper-deep hover:underline">
        {column.header}
        <span aria-hidden="true" className={active ? "text-copper-deep" : "text-rule"}>
          {active ? (sort.direction === "asc" ? "▲" : "▼") : "↕"}
        </span>
        <span className="sr-only">{active ? `, sorted ${sort.direction === "asc" ? "ascending" : "descending"}; sort the other way` : ", sort by this column"}</span>
      </Link>
    </HeaderCell>
  );
}

function Pager({ page, path, kept, noun, param, label }: { page: DataPage; path: string; kept: Record<string, string>; noun?: [string, string]; param: string; label: string }) {
  const count = noun ? `${page.total} ${page.total === 1 ? noun[0] : noun[1]}` : `${page.total} in all`;
  return (
    <nav aria-label={label} className="mt-3 flex flex-wrap items-center gap-4 text-sm" data-testid="pager">
      {page.page > 1 ? (
        <Link href={listHref(path, kept, { [param]: page.page - 1 })} className="text-copper-deep underline" rel="prev">
          ← Previous page
        </Link>
      ) : (
        <span className="text-ink-soft">← Previous page</span>
      )}
      <span aria-current="page">
        Page {page.page} of {page.pageCount}
      </span>
      {page.page < page.pageCount ? (
        <Link href={listHref(path, kept, { [param]: page.page + 1 })} className="text-copper-deep underline" rel="next">
          Next page →
        </Link>
      ) : (
        <span className="text-ink-soft">Next page →</span>
      )}
      <span className="text-ink-soft">{count}</span>
    </nav>
  );
}
