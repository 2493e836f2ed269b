import clsx from "clsx";
import type { AnchorHTMLAttributes, ComponentProps } from "react";
import { HoverPrefetchLink } from "./hover-prefetch-link";

const TEXT_LINK = "text-copper-deep underline";

/**
 * A link inside text or a table: copper and underlined, so it reads as one without colour. Its page is
 * fetched ahead only when the pointer rests on it (hover-prefetch-link.tsx), not whenever it is in view.
 */
export function TextLink({ className, ...props }: ComponentProps<typeof HoverPrefetchLink>) {
  return <HoverPrefetchLink {...props} className={clsx(TEXT_LINK, className)} />;
}

/** The same look as a plain anchor: a file the server hands out (a PDF, a CSV) or a jump within the page; never prefetched. */
export function PlainLink({ className, ...props }: AnchorHTMLAttributes<HTMLAnchorElement> & { href: string }) {
  return <a {...props} className={clsx(TEXT_LINK, className)} />;
}
