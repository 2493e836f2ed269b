import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getRun, getStepRecord, setRunStatus, upsertStepRecord } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { isPlausibleAmbient, stepRecordSchema, type StepRecord, type StepRecordInput } from "@/lib/conformance";
import { DomainError } from "@/lib/errors";
import { isRunOpen, RUN_STATUS_WORDS } from "./run-status";

/**
 * Saves what the operator recorded for one step of one cycle. The first record moves a planned run
 * to in progress. Changing a start or end time already recorded needs a reason, which the audit
 * trail keeps beside the old and new values. Nothing recorded is erased: every reading stays (struck
 * when wrong) and every correction stays; a new reading must be a value an ambient can take.
 */
export async function recordStep(
  actor: SignedInUser,
  runId: string,
  input: StepRecordInput & { timeChangeReason?: string },
  correction?: { summary: string[]; reason: string },
): Promise<void> {
  const { timeChangeReason, ...raw } = input;
  const record = stepRecordSchema.parse(raw);
  await getDb().transaction().execute(async (tx) => {
    const run = await getRun(tx, runId, { forUpdate: true });
    if (!run) throw new DomainError("not-found", "No such run.");
    if (!isRunOpen(run.status)) throw new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}; its records can no longer change.`);
    if (!run.resolution.steps.some((s) => s.id === record.stepId)) throw new DomainError("invalid", `The procedure of run ${run.number} has no step ${record.stepId}.`);
    const before = await getStepRecord(tx, runId, record.stepId, record.cycle);
    const timesChanged = before && ((before.startedAt && before.startedAt !== record.startedAt) || (before.endedAt && before.endedAt !== record.endedAt));
    if (timesChanged && !timeChangeReason?.trim() && !correction?.reason.trim()) {
      throw new DomainError("invalid", "Changing a recorded start or end time needs a reason.");
    }
    assertNothingErased(before, record);
    await upsertStepRecord(tx, runId, record, actor.id);
    if (run.status === "planned") await setRunStatus(tx, runId, "in_progress", "started_at");
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: correction ? "run.correct-step" : timesChanged ? "run.change-step-times" : "run.record-step",
      entityType: "run",
      entityId: runId,
      before: before ?? undefined,
      after: record,
      detail: {
        step: record.stepId,
        cycle: record.cycle,
        ...(timesChanged && { reason: timeChangeReason ?? correction?.reason }),
        ...(correction && { reason: correction.reason, corrected: correction.summary.join("; ") }),
      },
    });
  });
}

const sameReading = (a: StepRecord["ambientReadings"][number], b: StepRecord["ambientReadings"][number]) => a.at === b.at && a.celsius === b.celsius;

/** Good laboratory records: a reading or a correction once written is kept; a struck reading stays struck. */
function assertNothingErased(before: StepRecord | null, after: StepRecord): void {
  const readings = before?.ambientReadings ?? [];
  for (const old of readings) {
    const kept = after.ambientReadings.find((r) => sameReading(r, old));
    if (!kept || (old.struck && !kept.struck)) {
      throw new DomainError("invalid", "A recorded reading cannot be removed or un-struck; strike it with a reason instead.");
    }
  }
  const corrections = before?.corrections ?? [];
  if (corrections.some((c, i) => JSON.stringify(after.corrections?.[i]) !== JSON.stringify(c))) {
    throw new DomainError("invalid", "A correction once recorded is kept.");
  }
  const added = after.ambientReadings.filter((r) => !readings.some((old) => sameReading(r, old)));
  const implausible = added.find((r) => !r.struck && !isPlausibleAmbient(r.celsius));
  if (implausible) {
    throw new DomainError("invalid", `${implausible.celsius} °C cannot be an ambient temperature (readings lie between −60 °C and 150 °C).`);
  }
}
