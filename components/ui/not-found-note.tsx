import type { ReactNode } from "react";
import { TextLink } from "./text-link";

/** What a record's not-found.tsx shows: which kind of record is missing, why it may be, and the way back to its list. */
export function NotFoundNote({ title, children, back }: { title: string; children?: ReactNode; back: { href: string; words: string } }) {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">{title}</h1>
      {children ? <p className="mb-4">{children}</p> : null}
      <TextLink href={back.href}>{back.words}</TextLink>
    </div>
  );
}
