import type { ReactNode } from "react";
import { LabNav } from "@/components/nav/lab-nav";
import { QueryProvider } from "@/components/providers/query-provider";
import { getDb } from "@/db";
import { getLab } from "@/db/lab";
import { requirePageUser } from "@/lib/auth/guards";
import { can, ROLE_LABELS } from "@/lib/auth/permissions";
import { NAV_ITEMS } from "@/lib/navigation";
import { signOutAction } from "./actions";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

// No loading.tsx at this level: the sign-in check must finish before the response starts, so a
// missing session answers with a real redirect and a missing permission with a real 403.
export default async function LabLayout({ children }: { children: ReactNode }) {
  const user = await requirePageUser();
  const lab = await getLab(getDb());
  const items = NAV_ITEMS.filter((i) => can(user.role, i.permission)).map(({ href, label }) => ({ href, label }));
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="border-b border-rule bg-paper-deep">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-3">
          <div className="flex items-baseline gap-3">
            <HoverPrefetchLink href="/" className="font-serif text-xl font-bold">
              Cell<span className="text-copper">wright</span>
            </HoverPrefetchLink>
            {lab && <span className="text-sm text-ink-soft">{lab.name}</span>}
          </div>
          <div className="flex items-center gap-3 text-sm">
            <span>
              <HoverPrefetchLink href="/account" className="font-medium hover:underline" data-testid="signed-in-name" title="Your account: password and sessions">
                {user.displayName}
              </HoverPrefetchLink>{" "}
              <span className="text-ink-soft">· {ROLE_LABELS[user.role]}</span>
            </span>
            <form action={signOutAction}>
              <button type="submit" className="rounded border border-rule px-2 py-1 hover:border-copper">
                Sign out
              </button>
            </form>
          </div>
        </div>
        <div className="mx-auto max-w-6xl px-4 pb-2">
          <LabNav items={items} />
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">
        <QueryProvider>{children}</QueryProvider>
      </main>
      <footer className="border-t border-rule px-4 py-3 text-center text-xs text-ink-soft">
        Lithium cells can vent, burn or explode. Cellwright records and checks tests; it does not replace your
        lab&apos;s safety rules, local codes, licensed practice or the text of the standard.
      </footer>
    </div>
  );
}
