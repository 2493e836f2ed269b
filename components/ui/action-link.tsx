import Link from "next/link";
import type { ReactNode } from "react";

/** The page's main action as a link, drawn like the primary button. */
export function ActionLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <Link href={href} className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
      {children}
    </Link>
  );
}
