import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getRun, getStepRecord, setRunStatus, upsertStepRecord } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { stepRecordSchema, type StepRecordInput } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";

const OPEN = new Set(["planned", "in_progress", "returned"]);

/**
 * Saves what the operator recorded for one step of one cycle. The first record moves a planned run
 * to in progress. Changing a start or end time already recorded needs a reason, which the audit
 * trail keeps beside the old and new values.
 */
export async function recordStep(actor: SignedInUser, runId: string, input: StepRecordInput & { timeChangeReason?: string }): Promise<void> {
  const { timeChangeReason, ...raw } = input;
  const record = stepRecordSchema.parse(raw);
  await getDb().transaction().execute(async (tx) => {
    const run = await getRun(tx, runId, { forUpdate: true });
    if (!run) throw new DomainError("not-found", "No such run.");
    if (!OPEN.has(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${run.status.replace("_", " ")}; its records can no longer change.`);
    if (!run.resolution.steps.some((s) => s.id === record.stepId)) throw new DomainError("invalid", `The procedure of run ${run.number} has no step ${record.stepId}.`);
    const before = await getStepRecord(tx, runId, record.stepId, record.cycle);
    const timesChanged = before && ((before.startedAt && before.startedAt !== record.startedAt) || (before.endedAt && before.endedAt !== record.endedAt));
    if (timesChanged && !timeChangeReason?.trim()) {
      throw new DomainError("invalid", "Changing a recorded start or end time needs a reason.");
    }
    await upsertStepRecord(tx, runId, record, actor.id);
    if (run.status === "planned") await setRunStatus(tx, runId, "in_progress", "started_at");
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: timesChanged ? "run.change-step-times" : "run.record-step",
      entityType: "run",
      entityId: runId,
      before: before ?? undefined,
      after: record,
      detail: { step: record.stepId, cycle: record.cycle, ...(timesChanged && { reason: timeChangeReason }) },
    });
  });
}
