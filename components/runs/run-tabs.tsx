"use client";

import clsx from "clsx";
import { usePathname } from "next/navigation";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

/**
 * The views of one run: what was done, the cycler's log, what the checks found, the review (for
 * engineers, and for the operator to see why it is not theirs) and its history of reviews and changes.
 */
export function RunTabs({ runId, showReview }: { runId: string; showReview: boolean }) {
  const pathname = usePathname();
  const tabs = [
    { href: `/runs/${runId}`, label: "Step sheet" },
    { href: `/runs/${runId}/log`, label: "Data log" },
    { href: `/runs/${runId}/results`, label: "Findings and results" },
    ...(showReview ? [{ href: `/runs/${runId}/review`, label: "Review" }] : []),
    { href: `/runs/${runId}/history`, label: "History" },
  ];
  return (
    <nav aria-label="Views of this run" className="mb-6 border-b border-rule">
      <ul className="flex flex-wrap gap-1">
        {tabs.map((t) => {
          const current = pathname === t.href;
          return (
            <li key={t.href}>
              <HoverPrefetchLink
                href={t.href}
                aria-current={current ? "page" : undefined}
                className={clsx("block border-b-2 px-3 py-2 text-sm", current ? "border-copper font-semibold text-copper-deep" : "border-transparent hover:text-copper-deep")}
              >
                {t.label}
              </HoverPrefetchLink>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
