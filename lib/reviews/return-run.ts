import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { setRunStatus } from "@/db/runs";
import { getLatestRunEvaluation } from "@/db/run-series";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { enqueueMail } from "@/lib/mail/enqueue-mail";
import { composeRunReturned } from "@/lib/mail/messages";
import { actorLabel, loadRunForReview } from "./review-preconditions";
import { returnRunInputSchema, type ReturnRunInput } from "./review-input";

/**
 * Sends a submitted run back to its operator with the reviewer's comments. The review, the status,
 * the audit event and the e-mail to the operator are one transaction; the records, logs and
 * evaluations stay as they are (the operator corrects them and submits again).
 */
export async function returnRun(actor: SignedInUser, runId: string, input: ReturnRunInput): Promise<{ runNumber: string; operatorName: string }> {
  const { comments } = returnRunInputSchema.parse(input);
  const result = await getDb().transaction().execute(async (tx) => {
    const run = await loadRunForReview(tx, actor, runId, { forUpdate: true });
    const [evaluation, operator] = await Promise.all([
      getLatestRunEvaluation(tx, runId),
      tx.selectFrom("app_user").select(["email", "active"]).where("id", "=", run.operator.id).executeTakeFirstOrThrow(),
    ]);
    await tx
      .insertInto("run_review")
      .values({ run_id: runId, reviewer_id: actor.id, decision: "returned", comments, run_evaluation_id: evaluation?.id ?? null })
      .execute();
    await setRunStatus(tx, runId, "returned");
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: actorLabel(actor),
      action: "run.return",
      entityType: "run",
      entityId: runId,
      before: { status: run.status },
      after: { status: "returned" },
      detail: { number: run.number, comments, evaluation: evaluation?.id ?? "none" },
    });
    // A deactivated operator gets no mail; the comments wait on the step sheet for whoever continues.
    if (operator.active) {
      await enqueueMail(tx, {
        kind: "run-returned",
        recipients: [operator.email],
        ...composeRunReturned({ runNumber: run.number, runId, reviewerName: actor.displayName, comments }),
        entityType: "run",
        entityId: runId,
      });
    }
    return { runNumber: run.number, operatorName: run.operator.name };
  });
  // After the commit: a failed send is retried from the outbox and never undoes the return.
  kickMailDispatch();
  return result;
}
