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

export function HeaderCell({ className, children, ...props }: ThHTMLAttributes<HTMLTableCellElement>) {
  return (
    <th scope="col" {...props} className={clsx("py-2 pr-3", className)}>
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

export function Cell({ className, children, ...props }: TdHTMLAttributes<HTMLTableCellElement>) {
  return (
    <td {...props} className={clsx("py-2 pr-3", className)}>
      {children}
    </td>
  );
}

/** What a list says when nothing matches: plain words, under the table's header. */
export function EmptyState({ children }: { children: ReactNode }) {
  return <p className="py-6 text-ink-soft">{children}</p>;
}
