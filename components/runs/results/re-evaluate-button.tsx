"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { postJson } from "@/components/procedure-preview/post-json";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";

/** Evaluates the run again from what is stored, then shows the new evaluation. */
export function ReEvaluateButton({
  runId,
  runLogId,
  otherVersions = [],
}: {
  runId: string;
  runLogId: string | null;
  otherVersions?: { id: string; label: string }[];
}) {
  const router = useRouter();
  const [problem, setProblem] = useState<string | null>(null);
  const [against, setAgainst] = useState("");
  const [busy, startTransition] = useTransition();
  const evaluate = () =>
    startTransition(async () => {
      setProblem(null);
      try {
        await postJson(`/api/runs/${runId}/evaluations`, { runLogId, ...(against && { againstVersionId: against }) });
        router.refresh();
      } catch (e) {
        setProblem(e instanceof Error ? e.message : String(e));
      }
    });
  return (
    <div className="flex flex-col items-end gap-1">
      {otherVersions.length > 0 && (
        <SelectField
          filter
          id="judge-against"
          label="Judge against"
          value={against}
          onChange={(e) => setAgainst(e.target.value)}
          options={[{ value: "", label: "the version the run was carried out under" }, ...otherVersions.map((v) => ({ value: v.id, label: v.label }))]}
        />
      )}
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
