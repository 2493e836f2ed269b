import type { ReactNode } from "react";

export function PageHeader({ title, lead, actions }: { title: string; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-4">
      <div>
        <h1 className="text-2xl font-bold">{title}</h1>
        {lead && <p className="mt-1 max-w-3xl text-ink-soft">{lead}</p>}
      </div>
      {actions}
    </header>
  );
}
