import type { ReactNode } from "react";
import { getDb } from "@/db";
import { getLab } from "@/db/lab";

/** The public side: no sign-in, no navigation into the workbench. */
export default async function CheckLayout({ children }: { children: ReactNode }) {
  const lab = await getLab(getDb());
  return (
    <div className="mx-auto max-w-3xl px-4 py-8">
      <header className="mb-6 border-b-2 border-copper pb-3">
        <p className="text-sm text-ink-soft">Certificate check</p>
        <p className="font-serif text-xl font-bold">{lab?.name ?? "Cellwright"}</p>
        {lab?.address && <p className="text-sm text-ink-soft">{lab.address}</p>}
      </header>
      <main>{children}</main>
      <footer className="mt-10 border-t border-rule pt-3 text-xs text-ink-soft">
        This page shows only what the certificate itself states and whether it is still valid. It needs no account.
      </footer>
    </div>
  );
}
