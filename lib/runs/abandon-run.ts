import "server-only";
import { getDb } from "@/db";
import { recordAuditEvent } from "@/db/audit";
import { getRun, markRunAbandoned } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { DomainError } from "@/lib/errors";
import { isRunOpen, RUN_STATUS_WORDS } from "./run-status";

/**
 * Abandons an open run with a reason (cell vented, equipment fault, wrong specimen). Nothing is
 * deleted: the run keeps its records, is shown as abandoned, stays on its specimen's page and is left
 * out of every statistic (they count accepted and certified runs only).
 */
export async function abandonRun(actor: SignedInUser, runId: string, reason: string): Promise<void> {
  const why = reason.trim();
  if (why.length < 3) throw new DomainError("invalid", "Say why the run is abandoned.");
  await getDb().transaction().execute(async (tx) => {
    const run = await getRun(tx, runId, { forUpdate: true });
    if (!run) throw new DomainError("not-found", "No such run.");
    if (!isRunOpen(run.status)) {
      throw new DomainError("conflict", `Run ${run.number} is ${RUN_STATUS_WORDS[run.status].words}; only a run not yet submitted (or returned) can be abandoned.`);
    }
    await markRunAbandoned(tx, runId, actor.id, why);
    await recordAuditEvent(tx, {
      actorId: actor.id,
      actorLabel: `${actor.displayName} <${actor.email}>`,
      action: "run.abandon",
      entityType: "run",
      entityId: runId,
      before: { status: run.status },
      after: { status: "abandoned" },
      detail: { number: run.number, reason: why },
    });
  });
}
