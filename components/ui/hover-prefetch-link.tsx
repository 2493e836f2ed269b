"use client";

import Link from "next/link";
import { useState, type ComponentProps } from "react";

/**
 * A link that fetches its page ahead only once the pointer rests on it (or it gets focus), not when it
 * scrolls into view. Menus and tabs appear on every page: prefetching each of their targets on every page
 * view cost a dozen server renders per view and kept pages from settling (docs/decisions/fast-pages.md).
 */
export function HoverPrefetchLink(props: Omit<ComponentProps<typeof Link>, "prefetch">) {
  const [wanted, setWanted] = useState(false);
  return (
    <Link
      {...props}
      // null: Next's default prefetch (up to the loading boundary), asked for only when wanted.
      prefetch={wanted ? null : false}
      onMouseEnter={(e) => {
        setWanted(true);
        props.onMouseEnter?.(e);
      }}
      onFocus={(e) => {
        setWanted(true);
        props.onFocus?.(e);
      }}
    />
  );
}
