"use client";

import { Button } from "./button";
import { Notice } from "./notice";

/** What a section shows when rendering fails: plain words, and a way to try again. */
export function SectionError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="flex flex-col items-start gap-3">
      <Notice tone="problem" role="alert" title="This page could not be shown">
        Something went wrong on the server and it has been logged
        {error.digest ? ` (reference ${error.digest})` : ""}. Nothing you saved before has been lost.
      </Notice>
      <Button variant="secondary" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}
