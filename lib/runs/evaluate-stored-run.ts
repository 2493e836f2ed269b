import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCurrentRunLog, readRunLogColumns } from "@/db/run-logs";
import { getRun, listStepRecords } from "@/db/runs";
import type { LogColumns } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { evaluateRun, type RunEvaluation } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";

/**
 * Evaluates a run from what is stored (frozen set-points, step records, the current log) and keeps
 * the result. Deterministic: the same stored run gives the same findings. `columns` skips reading
 * the log back when the caller has just parsed it.
 */
export async function evaluateStoredRun(actor: SignedInUser, runId: string, opts: { columns?: LogColumns } = {}): Promise<RunEvaluation> {
  const db = getDb();
  const run = await getRun(db, runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  const [records, log] = await Promise.all([listStepRecords(db, runId), getCurrentRunLog(db, runId)]);
  const columns = opts.columns ?? (log ? await readRunLogColumns(db, log.id) : undefined);
  const stepRecords = records.map((r) => {
    const copy: Partial<typeof r> = { ...r };
    delete copy.recordedBy;
    delete copy.updatedAt;
    return copy as Omit<typeof r, "recordedBy" | "updatedAt">;
  });
  // A log with timestamps says when it began; an elapsed-time log is taken to begin with the first step.
  const logStartedAt = log?.loggedFrom?.toISOString() ?? stepRecords.map((r) => r.startedAt).filter((t): t is string => Boolean(t)).sort()[0];
  const result = evaluateRun({
    resolution: run.resolution,
    cellRating: run.cellRating,
    stepRecords,
    ...(columns && logStartedAt && { log: columns, logStartedAt }),
    procedureSource: run.procedureSource,
    evaluatedAgainst: { procedureVersionId: run.procedureVersionId },
  });
  if (!result.ok) throw new DomainError("invalid", `The run's records cannot be evaluated: ${result.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  const { evaluation } = result;
  await db.transaction().execute(async (tx) => {
    await tx
      .insertInto("run_evaluation")
      .values({
        run_id: runId,
        run_log_id: log?.id ?? null,
        procedure_version_id: run.procedureVersionId,
        evaluation: JSON.stringify(evaluation),
        procedure_followed: evaluation.verdict.procedureFollowed,
        specimen_conforms: evaluation.verdict.specimenConforms,
      })
      .execute();
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: "run.evaluate",
      entityType: "run",
      entityId: runId,
      after: { procedureFollowed: evaluation.verdict.procedureFollowed, specimenConforms: evaluation.verdict.specimenConforms },
    });
  });
  return evaluation;
}
