"use client";

import clsx from "clsx";
import { usePathname } from "next/navigation";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

export function LabNav({ items }: { items: { href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Workbench sections">
      <ul className="flex flex-wrap gap-1">
        {items.map((item) => {
          const current = item.href === "/" ? pathname === "/" : pathname.startsWith(item.href);
          return (
            <li key={item.href}>
              <HoverPrefetchLink
                href={item.href}
                aria-current={current ? "page" : undefined}
                className={clsx(
                  "block rounded px-3 py-1.5 text-sm",
                  current ? "bg-copper-wash font-semibold text-copper-deep" : "text-ink hover:text-copper-deep",
                )}
              >
                {item.label}
              </HoverPrefetchLink>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
