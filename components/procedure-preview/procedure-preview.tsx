"use client";

import { useId, useState } from "react";
import { describeCautionCode, describeChargeRetention, readDecisionRule, type ProcedureResolution } from "@/protocols";
import { ProblemList } from "./problem-list";
import { ResolutionCautions, ResolutionErrors } from "./resolution-issues";
import { ResolvedAcceptance } from "./resolved-acceptance";
import { ResolvedStepsTable } from "./resolved-steps-table";
import { nameSpecification, SpecPicker } from "./spec-picker";
import { useResolution, type PreviewSource } from "./use-resolution";

/**
 * A procedure resolved against a chosen cell specification: every set-point with its source,
 * the acceptance limits, what stops it from running, and the cautions to acknowledge. Used in the
 * editor (unsaved values) and on a version page (the stored version).
 */
export function ProcedurePreview({
  source,
  onAcknowledgeChange,
}: {
  source: PreviewSource;
  /** Editor only: records or removes a caution's code in the draft's acknowledged cautions. */
  onAcknowledgeChange?: (code: string, acknowledged: boolean) => void;
}) {
  const pickerId = useId();
  const [specId, setSpecId] = useState<string | null>(null);
  const view = useResolution(source, specId);
  return (
    <div className="flex flex-col gap-4" data-testid="procedure-preview">
      <SpecPicker id={pickerId} value={specId} onChange={setSpecId} />
      <div aria-live="polite" className="sr-only">
        {view.state === "resolved" && !view.updating ? `Resolved for ${nameSpecification(view.specification)}.` : ""}
      </div>
      {view.state === "loading" && (
        <p role="status" className="text-sm text-ink-soft">
          Working out the set-points…
        </p>
      )}
      {view.state === "failed" && (
        <p role="alert" className="text-sm text-deviates">
          The preview could not be worked out: {view.message}
        </p>
      )}
      {view.state === "invalid" && (
        <>
          <ProblemList
            title="The step list has problems, so nothing can be worked out yet"
            problems={view.procedureProblems}
            pathPrefix="definition"
            announce={source.kind === "version"}
          />
          <ProblemList title="The cell specification has problems" problems={view.cellProblems} />
        </>
      )}
      {view.state === "resolved" && (
        <ResolvedView
          resolution={view.resolution}
          cellName={nameSpecification(view.specification)}
          updating={view.updating}
          acknowledged={
            source.kind === "draft"
              ? new Set(source.acknowledgedCautions)
              : new Set(view.resolution.cautions.filter((c) => c.acknowledged).map((c) => c.code))
          }
          onAcknowledgeChange={source.kind === "draft" ? onAcknowledgeChange : undefined}
        />
      )}
      <p className="text-xs text-ink-soft">
        This preview helps you check the numbers before a run. Your lab&apos;s own safety rules and the text of the
        standard prevail over anything shown here.
      </p>
    </div>
  );
}

function describeReadiness(resolution: ProcedureResolution, acknowledged: ReadonlySet<string>): string {
  if (resolution.errors.length > 0) return "Cannot run on this cell";
  const open = resolution.cautions.filter((c) => !acknowledged.has(c.code)).length;
  if (open > 0) return `Needs acknowledgement: ${open === 1 ? "1 caution" : `${open} cautions`} before it can run on this cell`;
  return "Ready to run on this cell";
}

function ResolvedView({
  resolution,
  cellName,
  updating,
  acknowledged,
  onAcknowledgeChange,
}: {
  resolution: ProcedureResolution;
  cellName: string;
  updating: boolean;
  acknowledged: ReadonlySet<string>;
  onAcknowledgeChange?: (code: string, acknowledged: boolean) => void;
}) {
  const flagged = new Set([...resolution.errors, ...resolution.cautions].flatMap((issue) => (issue.stepId ? [issue.stepId] : [])));
  const readiness = describeReadiness(resolution, acknowledged);
  return (
    <div className="flex flex-col gap-4" aria-busy={updating}>
      <p className="text-sm">
        <span className="font-semibold">{readiness}</span> · {cellName}
        {updating && <span className="text-ink-soft"> · updating…</span>}
      </p>
      <ResolutionErrors errors={resolution.errors} />
      <ResolutionCautions cautions={resolution.cautions} acknowledged={acknowledged} onAcknowledgeChange={onAcknowledgeChange} />
      <ResolvedStepsTable steps={resolution.steps} flaggedStepIds={flagged} />
      <ResolvedAcceptance acceptance={resolution.acceptance} steps={resolution.steps} repeat={resolution.repeat} decisionRule={readDecisionRule(resolution)} />
      {resolution.retention && (
        <p className="text-sm" data-testid="retention-setting">
          {describeChargeRetention(resolution.retention, resolution.steps)}
        </p>
      )}
      {resolution.unmatchedAcknowledgements.length > 0 && (
        <p className="text-xs text-ink-soft">
          {resolution.unmatchedAcknowledgements.length === 1 ? "One acknowledgement" : `${resolution.unmatchedAcknowledgements.length} acknowledgements`}{" "}
          on record match no caution for this cell:{" "}
          {resolution.unmatchedAcknowledgements.map((code) => describeCautionCode(code, resolution.steps)).join("; ")}.
        </p>
      )}
    </div>
  );
}
