import clsx from "clsx";
import type { HTMLAttributes, ReactNode, TdHTMLAttributes, ThHTMLAttributes } from "react";

/** The lab's list table: full width, figures in lining numerals, scrolling sideways on a narrow screen. */
export function Table({ className, children, ...props }: HTMLAttributes<HTMLTableElement>) {
  return (
    <div className="overflow-x-auto">
      <table {...props} className={clsx("figures w-full border-collapse text-sm", className)}>
        {children}
      </table>
    </div>
  );
}

/** The header row: one `HeaderCell` a column. */
export function TableHead({ children }: { children: ReactNode }) {
  return (
    <thead>
      <tr className="border-b border-rule text-left">{children}</tr>
    </thead>
  );
}

/** Cell spacing: a list's roomy rows, or a results table's dense ones (many figures side by side). */
const PADDING = { list: "py-2 pr-3", dense: "px-2 py-1" } as const;

type Spacing = { dense?: boolean };

export function HeaderCell({ className, dense, children, ...props }: ThHTMLAttributes<HTMLTableCellElement> & Spacing) {
  return (
    <th scope="col" {...props} className={clsx(PADDING[dense ? "dense" : "list"], className)}>
      {children}
    </th>
  );
}

/** The first cell of a row that names it (a step, a result, a source): a row header in plain weight. */
export function RowHeaderCell({ className, dense, children, ...props }: ThHTMLAttributes<HTMLTableCellElement> & Spacing) {
  return (
    <th scope="row" {...props} className={clsx(PADDING[dense ? "dense" : "list"], "text-left font-normal", className)}>
      {children}
    </th>
  );
}

/** A body row, ruled below; `top` aligns cells of several lines to their first line. */
export function Row({ className, top, children, ...props }: HTMLAttributes<HTMLTableRowElement> & { top?: boolean }) {
  return (
    <tr {...props} className={clsx("border-b border-rule", top && "align-top", className)}>
      {children}
    </tr>
  );
}

export function Cell({ className, dense, children, ...props }: TdHTMLAttributes<HTMLTableCellElement> & Spacing) {
  return (
    <td {...props} className={clsx(PADDING[dense ? "dense" : "list"], className)}>
      {children}
    </td>
  );
}

/** What a list says when nothing matches: plain words, under the table's header. */
export function EmptyState({ children }: { children: ReactNode }) {
  return <p className="py-6 text-ink-soft">{children}</p>;
}
