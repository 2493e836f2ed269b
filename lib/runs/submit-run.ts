import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getRun, listStepRecords, setRunStatus } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";

/**
 * Hands a run to review. Every step outside a repeated block must be ticked, and the first cycle of
 * the block too; the audit event is the notice to the engineers (e-mail comes with certificates).
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
  });
}
