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
import { RUN_STATUS_WORDS } from "./run-status";
import { readSubmitReadiness } from "./submit-readiness";

/**
 * Hands a run to review. Every step outside a repeated block must be ticked, and the first cycle of
 * the block too. The data log must be stored and evaluated after the last change of the records;
 * when the evaluation found deviations, the operator confirms their count. The engineers are told
 * by e-mail, queued in the same transaction (a failed send never undoes the submission) and sent
 * once it has committed.
 */
export async function submitRun(actor: SignedInUser, runId: string, opts: { confirmedDeviations?: number } = {}): Promise<void> {
  await getDb().transaction().execute(async (tx) => {
    const run = await getRun(tx, runId, { forUpdate: true });
    if (!run) throw new DomainError("not-found", "No such run.");
    if (run.status !== "in_progress" && run.status !== "returned") {
      throw new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}; only a run in progress can be submitted.`);
    }
    const records = await listStepRecords(tx, runId);
    const ticked = new Set(records.filter((r) => r.completed).map((r) => `${r.stepId}#${r.cycle}`));
    const missing = run.resolution.steps.filter((s) => !ticked.has(`${s.id}#1`)).map((s) => s.label);
    if (missing.length > 0) throw new DomainError("conflict", `Tick every step before submitting; still open: ${missing.join(", ")}.`);
    const readiness = await readSubmitReadiness(tx, runId);
    if (readiness.problems.length > 0) throw new DomainError("conflict", `Run ${run.number} cannot be submitted yet. ${readiness.problems.join(" ")}`);
    const deviations = readiness.evaluation?.deviations ?? 0;
    if (deviations > 0 && opts.confirmedDeviations !== deviations) {
      throw new DomainError(
        "conflict",
        `The evaluation found ${deviations} deviation${deviations === 1 ? "" : "s"}. Read ${deviations === 1 ? "it" : "them"} on the Findings and results tab, then confirm that you submit the run with ${deviations === 1 ? "it" : "them"}.`,
      );
    }
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
      detail: { notify: "engineers", number: run.number, deviations },
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
