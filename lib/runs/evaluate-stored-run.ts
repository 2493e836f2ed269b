import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCellSpecification } from "@/db/cell-specifications";
import { getInstrument } from "@/db/instruments";
import { getProcedureVersionById } from "@/db/procedures";
import { getCurrentRunLog, readRunLogColumns } from "@/db/run-logs";
import { getRun, listRunInstrumentIds, listStepRecords } from "@/db/runs";
import type { RunStatus } from "@/db/schema";
import type { LogColumns } from "@/lib/analysis";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { evaluateRun, toStoredEvaluation, type RunEvaluation, type RunInstrument } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";
import { resolveProcedure, type ProcedureResolution } from "@/protocols";

/**
 * Evaluates a run from what is stored (frozen set-points, step records, the current log, the accuracy
 * the instrument register states for the run's instruments, as it stands now) and keeps
 * the result. Deterministic: the same stored run gives the same findings. `columns` skips reading
 * the log back when the caller has just parsed it. `againstVersionId` judges the same records against
 * another released version of the same procedure (resolved on the specimen's cell as it is now); the
 * evaluation is then marked as made against a version other than the one the run was carried out under.
 */
export async function evaluateStoredRun(
  actor: SignedInUser | { machineLabel: string },
  runId: string,
  opts: { columns?: LogColumns; againstVersionId?: string } = {},
): Promise<RunEvaluation> {
  const db = getDb();
  const run = await getRun(db, runId);
  if (!run) throw new DomainError("not-found", "No such run.");
  refuseIfFinal(run);
  const against = opts.againstVersionId && opts.againstVersionId !== run.procedureVersionId ? await resolveOtherVersion(run, opts.againstVersionId) : null;
  const [records, log, instruments] = await Promise.all([listStepRecords(db, runId), getCurrentRunLog(db, runId), readRunInstruments(runId)]);
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
    resolution: against?.resolution ?? run.resolution,
    cellRating: run.cellRating,
    stepRecords,
    ...(columns && { log: columns }),
    ...(logStartedAt && { logStartedAt, logStartedFrom: log?.loggedFrom ? ("log timestamps" as const) : ("first recorded step start" as const) }),
    procedureSource: run.procedureSource,
    instruments,
    evaluatedAgainst: against
      ? { procedureVersionId: against.versionId, runProcedureVersionId: run.procedureVersionId, note: `re-evaluated against ${against.label}` }
      : { procedureVersionId: run.procedureVersionId },
  });
  if (!result.ok) throw new DomainError("invalid", `The run's records cannot be evaluated: ${result.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
  const { evaluation } = result;
  await db.transaction().execute(async (tx) => {
    // Checked again with the run row locked: an acceptance (which locks the same row) either finished
    // before this point and is seen here, or waits until this evaluation is stored and then sees it.
    // The database refuses the insert too (run_evaluation_frozen_with_run, migrations 0008 and 0020).
    const locked = await getRun(tx, runId, { forUpdate: true });
    if (!locked) throw new DomainError("not-found", "No such run.");
    refuseIfFinal(locked);
    await tx
      .insertInto("run_evaluation")
      .values({
        run_id: runId,
        run_log_id: log?.id ?? null,
        procedure_version_id: against?.versionId ?? run.procedureVersionId,
        evaluation: JSON.stringify(toStoredEvaluation(evaluation)),
        procedure_followed: evaluation.verdict.procedureFollowed,
        specimen_conforms: evaluation.verdict.specimenConforms,
      })
      .execute();
    await recordAuditEvent(tx, {
      ...("machineLabel" in actor ? { actorId: null, actorLabel: `push from ${actor.machineLabel}` } : { actorId: actor.id, actorLabel: `${actor.displayName} <${actor.email}>` }),
      action: "run.evaluate",
      entityType: "run",
      entityId: runId,
      after: { procedureFollowed: evaluation.verdict.procedureFollowed, specimenConforms: evaluation.verdict.specimenConforms },
      ...(against && { detail: { against: against.label } }),
    });
  });
  return evaluation;
}

/** The reviewer signed for one evaluation; a later one would leave the certificate resting on a stale basis. */
function refuseIfFinal(run: { number: string; status: RunStatus }): void {
  if (run.status === "accepted" || run.status === "certified") {
    throw new DomainError("conflict", `Run ${run.number} is ${run.status}: the evaluation its reviewer signed for is final and is not evaluated again.`);
  }
}

async function resolveOtherVersion(
  run: NonNullable<Awaited<ReturnType<typeof getRun>>>,
  versionId: string,
): Promise<{ versionId: string; label: string; resolution: ProcedureResolution }> {
  const db = getDb();
  const [version, own] = await Promise.all([getProcedureVersionById(db, versionId), getProcedureVersionById(db, run.procedureVersionId)]);
  if (!version || !own || version.procedureId !== own.procedureId) throw new DomainError("invalid", "Choose a version of the same procedure.");
  if (version.status !== "released" && version.status !== "withdrawn") throw new DomainError("conflict", "Only a released (or since withdrawn) version can be used to judge a run.");
  const spec = await getCellSpecification(db, run.specimen.cellSpecificationId);
  if (!spec) throw new DomainError("not-found", "The specimen's cell specification is missing.");
  const resolved = resolveProcedure({ procedure: version.definition, cellSpecification: spec.data, acknowledgedCautions: version.acknowledgedCautions });
  if (!resolved.ok || resolved.resolution.errors.length > 0) throw new DomainError("conflict", `${version.code} version ${version.number} cannot be resolved on this cell.`);
  return { versionId: version.id, label: `${version.code} version ${version.number}`, resolution: resolved.resolution };
}

/** The run's instruments with the accuracy the register states for them: the inputs of the uncertainty budgets. */
async function readRunInstruments(runId: string): Promise<RunInstrument[]> {
  const db = getDb();
  const ids = await listRunInstrumentIds(db, runId);
  const found = await Promise.all(ids.map((id) => getInstrument(db, id)));
  return found
    .filter((instrument) => instrument !== null)
    .map((instrument) => ({ identifier: instrument.identifier, kind: instrument.kind, accuracy: instrument.accuracy }));
}
