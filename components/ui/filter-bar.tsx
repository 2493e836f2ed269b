import type { InputHTMLAttributes, ReactNode } from "react";
import { TextLink } from "./text-link";

/**
 * A list's filters, sent with the page's own address (`GET`), so what is shown lives in the URL.
 * Changing a filter starts again at page 1 because the form does not carry `page`; `keep` carries
 * the sort, so a filtered list stays sorted as it was. `clear` links back to the whole list.
 */
export function FilterBar({
  children,
  keep,
  label,
  clear,
  grid,
}: {
  children: ReactNode;
  keep?: Record<string, string | undefined>;
  /** What the filters narrow, for a screen reader ("Filter certificates"). */
  label?: string;
  clear?: { href: string; words: string };
  /** Many filters: lay them out in columns instead of one wrapping row. */
  grid?: boolean;
}) {
  return (
    <form className={grid ? "mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-4" : "mb-4 flex flex-wrap items-end gap-3"} role="search" aria-label={label}>
      {Object.entries(keep ?? {}).map(([name, value]) => (value === undefined ? null : <input key={name} type="hidden" name={name} value={value} />))}
      {children}
      <div className="flex items-end gap-3">
        <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
          Show
        </button>
        {clear && (
          <TextLink href={clear.href} className="py-1.5 text-sm">
            {clear.words}
          </TextLink>
        )}
      </div>
    </form>
  );
}

/** A typed filter (words, a date) with its label above it, drawn as small as a filter drop-down. */
export function FilterInput({ label, name, ...input }: InputHTMLAttributes<HTMLInputElement> & { label: string; name: string }) {
  return (
    <label className="flex flex-col text-sm">
      {label}
      <input name={name} className="rounded border border-rule bg-white px-2 py-1.5 text-ink" {...input} />
    </label>
  );
}

/** A yes/no filter: sends `name=1` when ticked. */
export function FilterCheck({ label, name, checked }: { label: string; name: string; checked: boolean }) {
  return (
    <label className="flex min-h-9 items-center gap-2 text-sm">
      <input type="checkbox" name={name} value="1" defaultChecked={checked} className="size-4 accent-copper" />
      {label}
    </label>
  );
}
