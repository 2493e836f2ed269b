import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { noteRunSubmitter } from "@/db/run-participants";
import { getRun, listStepRecords, setRunStatus } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { kickMailDispatch } from "@/lib/mail/dispatch";
import { enqueueMail, listRecipientsByRole } from "@/lib/mail/enqueue-mail";
import { composeRunSubmitted } from "@/lib/mail/messages";

/**
 * Hands a run to review. Every step outside a repeated block must be ticked, and the first cycle of
 * the block too. The engineers are told by e-mail, queued in the same transaction (a failed send
 * never undoes the submission) and sent once it has committed.
 */
export async function submitRun(actor: SignedInUser, runId: string): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const run = await getRun(tx, runId, { forUpdate: true });
    if (!run) throw new DomainError("not-found", "No such run.");
    if (run.status !== "in_progress" && run.status !== "returned") {
      throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; only a run in progress can be submitted.`);
    }
    const records = await listStepRecords(tx, runId);
    const ticked = new Set(records.filter((r) => r.completed).map((r) => `${r.stepId}#${r.cycle}`));
    const missing = run.resolution.steps.filter((s) => !ticked.has(`${s.id}#1`)).map((s) => s.label);
    if (missing.length > 0) throw new DomainError("conflict", `Tick every step before submitting; still open: ${missing.join(", ")}.`);
    await setRunStatus(tx, runId, "submitted", "submitted_at");
    await noteRunSubmitter(tx, runId, actor.id);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: "run.submit",
      entityType: "run",
      entityId: runId,
      before: { status: run.status },
      after: { status: "submitted" },
      detail: { notify: "engineers", number: run.number },
    });
    // Never to the run's own operator, should they hold the engineer's role: they may not review it.
    const operator = await tx.selectFrom("app_user").select("email").where("id", "=", run.operator.id).executeTakeFirst();
    const engineers = (await listRecipientsByRole(tx, "engineer")).filter((email) => email.toLowerCase() !== operator?.email.toLowerCase());
    const notice = composeRunSubmitted({
      runNumber: run.number,
      runId,
      specimen: run.specimen.identifier,
      procedure: `${run.procedure.code} v${run.procedure.number} “${run.procedure.title}”`,
      operatorName: run.operator.name,
    });
    await enqueueMail(tx, { kind: "run-submitted", recipients: engineers, ...notice, entityType: "run", entityId: runId });
  });
  kickMailDispatch();
}
