import "server-only";
import { getDb, type Executor } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getCurrentRunLog } from "@/db/run-logs";
import { getLatestRunEvaluation } from "@/db/run-series";
import { setRunStatus } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { confirmSignerPassword, insertSignature, type SignatureManifestation } from "@/lib/signatures/sign-record";
import { actorLabel, loadRunForReview } from "./review-preconditions";
import { acceptRunInputSchema, type AcceptRunInput } from "./review-input";
import { hashReviewedRecord, listDeviatingFindings, matchAcknowledgements, type Acknowledgement } from "./reviewed-record";

/**
 * Checks what an acceptance rests on: the run's latest evaluation (the one the reviewer read, if the
 * form says which) and a note on each of its deviating findings.
 */
async function checkAcceptable(tx: Executor, actor: SignedInUser, runId: string, input: { acknowledgements: Acknowledgement[]; evaluationId?: string }, forUpdate: boolean) {
  const run = await loadRunForReview(tx, actor, runId, { forUpdate });
  const [stored, log] = await Promise.all([getLatestRunEvaluation(tx, runId), getCurrentRunLog(tx, runId)]);
  if (!stored) {
    throw new DomainError("conflict", `Run ${run.number} has not been evaluated: evaluate it on its Findings and results tab, then accept it. Nothing was signed.`);
  }
  // The findings signed for must be those of the data log the run now holds.
  if (log && stored.runLogId !== log.id) {
    throw new DomainError("conflict", `The latest evaluation of run ${run.number} was made on an earlier data log: evaluate it again on its Findings and results tab, then accept it. Nothing was signed.`);
  }
  if (input.evaluationId && input.evaluationId !== stored.id) {
    throw new DomainError("conflict", `Run ${run.number} was evaluated again after you opened it. Read the new findings, then sign. Nothing was signed.`);
  }
  const evaluation = stored.evaluation;
  const labels = new Map(evaluation.steps.map((s) => [`${s.stepId}#${s.cycle}`, s.label]));
  const matched = matchAcknowledgements(listDeviatingFindings(evaluation), input.acknowledgements, (f) =>
    f.stepId === null ? `${f.title} (the run as a whole)` : `${f.title} (${labels.get(`${f.stepId}#${f.cycle}`) ?? f.stepId})`,
  );
  if (!matched.ok) throw new DomainError("invalid", `${matched.message} Nothing was signed.`);
  return { run, stored, evaluation, acknowledged: matched.acknowledged };
}

/**
 * Accepts a submitted run with the reviewer's electronic signature, meaning "reviewed" (21 CFR 11.50,
 * 11.200: the password is asked again). Nothing is written unless every check passes; then the
 * signature, the review with the notes on each deviation, the status and the audit event are one
 * transaction. A wrong password is audited on its own (lib/signatures) and nothing else is written.
 */
export async function acceptRun(actor: SignedInUser, runId: string, input: AcceptRunInput): Promise<{ runNumber: string; signature: SignatureManifestation }> {
  const parsed = acceptRunInputSchema.parse(input);
  // Plain refusals first, so a reviewer who may not sign hears why before being asked for a password.
  const pre = await checkAcceptable(getDb(), actor, runId, parsed, false);
  await confirmSignerPassword(actor, parsed.password, `acceptance of run ${pre.run.number} (meaning: reviewed)`, { entityType: "run", entityId: runId });
  return getDb().transaction().execute(async (tx) => {
    const { run, stored, evaluation, acknowledged } = await checkAcceptable(tx, actor, runId, { ...parsed, evaluationId: parsed.evaluationId ?? pre.stored.id }, true);
    const recordSha256 = hashReviewedRecord({ runId, evaluationId: stored.id, evaluation });
    const signature = await insertSignature(tx, { signer: actor, meaning: "reviewed", entityType: "run", entityId: runId, recordSha256 });
    await tx
      .insertInto("run_review")
      .values({
        run_id: runId,
        reviewer_id: actor.id,
        decision: "accepted",
        run_evaluation_id: stored.id,
        acknowledged_deviations: JSON.stringify(acknowledged),
        signature_id: signature.id,
      })
      .execute();
    await setRunStatus(tx, runId, "accepted");
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: actorLabel(actor),
      action: "run.accept",
      entityType: "run",
      entityId: runId,
      before: { status: run.status },
      after: { status: "accepted" },
      detail: {
        number: run.number,
        signed: `${signature.printedName}, ${signature.signedAt.toISOString()}, meaning ${signature.meaning}`,
        evaluation: stored.id,
        deviationsAcknowledged: acknowledged.length,
        recordSha256,
      },
    });
    return { runNumber: run.number, signature };
  });
}
