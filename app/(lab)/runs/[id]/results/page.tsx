import { preload } from "react-dom";
import { z } from "zod";
import { ConformityTable } from "@/components/runs/results/conformity-table";
import { EnduranceSection } from "@/components/runs/results/endurance-section";
import { FindingGroups } from "@/components/runs/results/finding-groups";
import { ObservationsSection } from "@/components/runs/results/observations-section";
import { ResultsTable } from "@/components/runs/results/results-table";
import { RetentionTable } from "@/components/runs/results/retention-table";
import { CapacityPlot, CycleTrend, TimePlot } from "@/components/runs/results/run-plots-lazy";
import { ReEvaluateButton } from "@/components/runs/results/re-evaluate-button";
import { UncertaintySection } from "@/components/runs/results/uncertainty-section";
import { VerdictWords } from "@/components/runs/results/verdict-words";
import { Notice } from "@/components/ui/notice";
import { PlainLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProcedureVersionStates } from "@/db/procedures";
import { getCurrentRunLog } from "@/db/run-logs";
import { getRunSummary } from "@/db/runs";
import { getLatestRunEvaluationHead } from "@/db/run-series";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { readCycleTrend } from "@/lib/runs/read-cycle-trend";
import { readEvaluationView } from "@/lib/runs/read-evaluation-view";
import { formatRunSeriesUrl } from "@/lib/runs/run-series-url";
import { loadFindingGroupAction } from "./actions";

/** How often the trend asks for new cycles while log parts arrive. */
const TREND_REFRESH_MS = 30_000;

export default async function RunResultsPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/runs/[id]/results");
  const runId = z.uuid().parse((await params).id);
  const mayEvaluate = can(user.role, "run.operate") || can(user.role, "run.review");
  // The latest evaluation's id first: its view (findings grouped, result rows) is worked out once per process.
  const [stored, log, run, trend] = await Promise.all([getLatestRunEvaluationHead(getDb(), runId), getCurrentRunLog(getDb(), runId), getRunSummary(getDb(), runId), readCycleTrend(runId)]);
  // A run of many cycles (an endurance test) shows its trend first, also before it can be evaluated.
  const trendSection =
    trend && (trend.rows.length >= 2 || trend.stop) ? (
      <section aria-labelledby="cycles-heading">
        <h2 id="cycles-heading" className="mb-2 text-lg font-semibold">
          Capacity per cycle
        </h2>
        <CycleTrend runId={runId} initial={trend} refreshMs={TREND_REFRESH_MS} />
      </section>
    ) : null;
  const view = stored ? await readEvaluationView(stored.id) : null;
  // Other versions of the same procedure the records can be judged against (marked as such).
  const otherVersions = run && mayEvaluate
    ? (await listProcedureVersionStates(getDb(), run.procedure.id))
        .filter((v) => v.id !== run.procedureVersionId && (v.status === "released" || v.status === "withdrawn"))
        .map((v) => ({ id: v.id, label: `${v.code} version ${v.number} (${v.status})` }))
    : [];
  const action = mayEvaluate ? <ReEvaluateButton runId={runId} runLogId={log?.id ?? null} otherVersions={otherVersions} /> : null;
  if (!stored || !view) {
    return (
      <div className="flex flex-col items-start gap-3">
        {trendSection}
        <Notice>This run has not been evaluated yet. It is evaluated when a data log is uploaded, or when you press “Evaluate again”.</Notice>
        {action}
      </div>
    );
  }
  const { evaluation, decisionRule } = view;
  const discharges = evaluation.steps.filter((s) => s.kind === "discharge" && s.logPhase);
  const onCurrentLog = log !== null && stored.runLogId === log.id;
  if (onCurrentLog) {
    // The browser starts on the plots' data while the page's scripts load; the plots' own requests then find it.
    for (const url of [formatRunSeriesUrl(runId), ...discharges.map((s) => formatRunSeriesUrl(runId, s))]) preload(url, { as: "fetch", crossOrigin: "anonymous" });
  }
  return (
    <div className="flex flex-col gap-8">
      {trendSection}
      <section aria-labelledby="verdict-heading" className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <h2 id="verdict-heading" className="mb-2 text-lg font-semibold">
            Verdict
          </h2>
          {evaluation.evaluatedAgainst.otherThanRunVersion && (
            <div className="mb-2">
              <Notice tone="caution" title="Judged against another version">
                {evaluation.evaluatedAgainst.note ?? "This evaluation used another version of the procedure"}: not the version the run was carried out under.
              </Notice>
            </div>
          )}
          <VerdictWords verdict={evaluation.verdict} decisionRule={evaluation.conformity.length > 0 ? decisionRule : undefined} />
          <p className="mt-2 text-xs text-ink-soft">
            Evaluated {stored.evaluatedAt.toISOString().replace("T", " ").slice(0, 16)} UTC
            {stored.runLogId === null ? " without a data log" : onCurrentLog ? " on the current data log" : " on an earlier data log"}.{" "}
            <PlainLink href={`/api/runs/${runId}/results.csv`}>
              Results as CSV
            </PlainLink>{" "}
            ·{" "}
            <PlainLink href={`/api/runs/${runId}/results.json`}>
              as JSON
            </PlainLink>
          </p>
        </div>
        {action}
      </section>
      <section aria-labelledby="findings-heading">
        <h2 id="findings-heading" className="mb-2 text-lg font-semibold">
          Findings
        </h2>
        <FindingGroups runId={runId} evaluationId={stored.id} groups={view.groups} load={loadFindingGroupAction} />
      </section>
      <section aria-labelledby="results-heading">
        <h2 id="results-heading" className="mb-2 text-lg font-semibold">
          Results per step
        </h2>
        <ResultsTable rows={view.resultRows} />
      </section>
      {evaluation.retention && (
        <section aria-labelledby="retention-heading">
          <h2 id="retention-heading" className="mb-2 text-lg font-semibold">
            Charge retention and recovery
          </h2>
          <RetentionTable retention={evaluation.retention} />
        </section>
      )}
      {evaluation.endurance && (
        <section aria-labelledby="endurance-heading">
          <h2 id="endurance-heading" className="mb-2 text-lg font-semibold">
            Endurance in cycles
          </h2>
          <EnduranceSection endurance={evaluation.endurance} />
        </section>
      )}
      {evaluation.observations && (
        <section aria-labelledby="observations-heading">
          <h2 id="observations-heading" className="mb-2 text-lg font-semibold">
            Observations
          </h2>
          <ObservationsSection observations={evaluation.observations} />
        </section>
      )}
      <section aria-labelledby="conformity-heading">
        <h2 id="conformity-heading" className="mb-2 text-lg font-semibold">
          Statement of conformity
        </h2>
        <ConformityTable decisionRule={decisionRule} conformity={evaluation.conformity} acceptance={evaluation.acceptance} />
      </section>
      <section aria-labelledby="uncertainty-heading">
        <h2 id="uncertainty-heading" className="mb-2 text-lg font-semibold">
          Measurement uncertainty
        </h2>
        <UncertaintySection steps={evaluation.steps} uncertainty={evaluation.uncertainty} notEvaluated={evaluation.uncertaintyNotEvaluated} />
      </section>
      {onCurrentLog && (
        <section aria-labelledby="plots-heading" className="flex flex-col gap-6">
          <h2 id="plots-heading" className="text-lg font-semibold">
            Plots
          </h2>
          <TimePlot runId={runId} />
          {discharges.map((s) => (
            <CapacityPlot key={`${s.stepId}#${s.cycle}`} runId={runId} stepId={s.stepId} cycle={s.cycle} label={s.label} />
          ))}
        </section>
      )}
    </div>
  );
}
