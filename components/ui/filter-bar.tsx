import type { ReactNode } from "react";

/**
 * A list's filters, sent with the page's own address (`GET`), so what is shown lives in the URL.
 * Changing a filter starts again at page 1 because the form does not carry `page`; `keep` carries
 * the sort, so a filtered list stays sorted as it was.
 */
export function FilterBar({ children, keep }: { children: ReactNode; keep?: Record<string, string | undefined> }) {
  return (
    <form className="mb-4 flex flex-wrap items-end gap-3" role="search">
      {Object.entries(keep ?? {}).map(([name, value]) => (value === undefined ? null : <input key={name} type="hidden" name={name} value={value} />))}
      {children}
      <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
        Show
      </button>
    </form>
  );
}
