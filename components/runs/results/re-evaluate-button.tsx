"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { postJson } from "@/components/procedure-preview/post-json";
import { Button } from "@/components/ui/button";

/** Evaluates the run again from what is stored, then shows the new evaluation. */
export function ReEvaluateButton({ runId, runLogId }: { runId: string; runLogId: string | null }) {
  const router = useRouter();
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, startTransition] = useTransition();
  const evaluate = () =>
    startTransition(async () => {
      setProblem(null);
      try {
        await postJson(`/api/runs/${runId}/evaluations`, { runLogId });
        router.refresh();
      } catch (e) {
        setProblem(e instanceof Error ? e.message : String(e));
      }
    });
  return (
    <div className="flex flex-col items-end gap-1">
      <Button variant="secondary" onClick={evaluate} disabled={busy}>
        {busy ? "Evaluating…" : "Evaluate again"}
      </Button>
      {problem && (
        <p role="alert" className="text-sm text-deviates">
          {problem}
        </p>
      )}
    </div>
  );
}
