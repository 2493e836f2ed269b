import "server-only";
import type { Executor } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { getLatestRunEvaluation } from "@/db/run-series";
import { listFindings } from "@/lib/conformance";
import { needsDataLog, type ProcedureResolution } from "@/protocols";

export interface SubmitReadiness {
  log: { fileName: string; sampleCount: number } | null;
  /** The latest evaluation, if it judged the current log and the records as they stand. */
  evaluation: { id: string; evaluatedAt: Date; deviations: number } | null;
  /** What stands in the way, in words; empty when the run may be submitted. */
  problems: string[];
}

/**
 * A run goes to review only with its data log stored and an evaluation of that log made after the
 * last change of its step records: the reviewer must never meet a run that says "not evaluated".
 */
export async function readSubmitReadiness(db: Executor, runId: string): Promise<SubmitReadiness> {
  const [log, latest, lastRecord, run] = await Promise.all([
    getCurrentRunLog(db, runId),
    getLatestRunEvaluation(db, runId),
    db.selectFrom("step_record").select((eb) => eb.fn.max("updated_at").as("at")).where("run_id", "=", runId).executeTakeFirst(),
    db.selectFrom("run").select("resolution").where("id", "=", runId).executeTakeFirst(),
  ]);
  const logNeeded = run === undefined || needsDataLog(run.resolution as ProcedureResolution);
  const problems: string[] = [];
  if (!log && logNeeded) problems.push("No data log is stored yet: upload the cycler's log on the Data log tab.");
  const lastChange = lastRecord?.at ? new Date(lastRecord.at) : null;
  const current = latest !== null && latest.runLogId === (log?.id ?? null) && (lastChange === null || latest.evaluatedAt >= lastChange);
  if ((log || !logNeeded) && !current) {
    problems.push("The run has not been evaluated since its step records or its log last changed: press “Evaluate again” on the Findings and results tab.");
  }
  return {
    log: log ? { fileName: log.fileName, sampleCount: log.sampleCount } : null,
    evaluation:
      current && latest
        ? {
            id: latest.id,
            evaluatedAt: latest.evaluatedAt,
            // Written only by lib/runs from evaluateRun's output.
            deviations: listFindings(latest.evaluation).filter((f) => f.outcome === "deviates").length,
          }
        : null,
    problems,
  };
}
