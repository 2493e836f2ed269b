import clsx from "clsx";
import Link from "next/link";
import type { AnchorHTMLAttributes, ComponentProps } from "react";

const TEXT_LINK = "text-copper-deep underline";

/** A link inside text or a table: copper and underlined, so it reads as one without colour. */
export function TextLink({ className, ...props }: ComponentProps<typeof Link>) {
  return <Link {...props} className={clsx(TEXT_LINK, className)} />;
}

/** The same look as a plain anchor: a file the server hands out (a PDF, a CSV) or a jump within the page; never prefetched. */
export function PlainLink({ className, ...props }: AnchorHTMLAttributes<HTMLAnchorElement> & { href: string }) {
  return <a {...props} className={clsx(TEXT_LINK, className)} />;
}
