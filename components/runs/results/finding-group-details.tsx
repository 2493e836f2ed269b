"use client";

import { useState, useTransition } from "react";
import type { FindingLine } from "@/lib/runs/group-findings";
import { FindingLinesTable } from "./finding-lines-table";

export type LoadFindingGroup = (ask: { runId: string; evaluationId: string; groupKey: string }) => Promise<{ lines: FindingLine[] } | { message: string }>;

/**
 * One step's findings behind its summary line. An open group (something to look at) arrives with its
 * findings; a closed one fetches them the first time it is opened, so the page carries only the summaries.
 */
export function FindingGroupDetails({
  runId,
  evaluationId,
  groupKey,
  summary,
  lines: initialLines,
  load,
}: {
  runId: string;
  evaluationId: string;
  groupKey: string;
  summary: React.ReactNode;
  lines: FindingLine[] | null;
  load: LoadFindingGroup;
}) {
  const [lines, setLines] = useState(initialLines);
  const [problem, setProblem] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  return (
    <details
      open={initialLines !== null}
      className="rounded border border-rule bg-white"
      data-testid="finding-group"
      onToggle={(e) => {
        if (!e.currentTarget.open || lines !== null || pending) return;
        setProblem(null);
        startTransition(async () => {
          const answer = await load({ runId, evaluationId, groupKey }).catch(() => ({ message: "The findings could not be loaded. Try again." }));
          if ("lines" in answer) setLines(answer.lines);
          else setProblem(answer.message);
        });
      }}
    >
      <summary className="cursor-pointer px-3 py-2 text-sm">{summary}</summary>
      <div className="px-1 pb-2">
        {lines !== null ? (
          <FindingLinesTable lines={lines} />
        ) : problem ? (
          <p role="alert" className="px-2 text-sm text-deviates">
            {problem}
          </p>
        ) : (
          <p role="status" className="px-2 text-sm text-ink-soft">
            Loading the findings…
          </p>
        )}
      </div>
    </details>
  );
}
