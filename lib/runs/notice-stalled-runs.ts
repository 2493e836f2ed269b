import "server-only";
import { getDb } from "@/db";
import { listRunsWithoutSamplesSince } from "@/db/run-cycles";
import { enqueueMail, listRecipientsByRole } from "@/lib/mail/enqueue-mail";
import { composeRunStalled } from "@/lib/mail/messages";
import { isRunOpen, RUN_STATUS_WORDS } from "./run-status";
import type { RunStatus } from "@/db/schema";

/** Hours without new samples before an open run with cycles counts as stalled, unless STALL_AFTER_HOURS says otherwise. */
export const DEFAULT_STALL_AFTER_HOURS = 6;

export function readStallAfterHours(env: NodeJS.ProcessEnv = process.env): number {
  const hours = Number(env.STALL_AFTER_HOURS);
  return Number.isFinite(hours) && hours > 0 ? hours : DEFAULT_STALL_AFTER_HOURS;
}

/**
 * Queues a notice for every open run whose samples stopped arriving more than `hours` ago, before its stop
 * criterion was met: the cycler, its computer or the link may have stopped. Once per silence: the once-key
 * names the last arrival, so a run that gets data again and then falls silent again is noticed again.
 * Runs in the log worker's process (scripts/worker.ts), every STALL_CHECK_MS. Returns the runs noticed.
 */
export async function noticeStalledRuns(now: Date, hours = readStallAfterHours()): Promise<string[]> {
  const openStatuses = (Object.keys(RUN_STATUS_WORDS) as RunStatus[]).filter(isRunOpen);
  const before = new Date(now.getTime() - hours * 3600_000);
  const stalled = await listRunsWithoutSamplesSince(getDb(), before, openStatuses);
  const noticed: string[] = [];
  for (const run of stalled) {
    await getDb()
      .transaction()
      .execute(async (tx) => {
        const engineers = await listRecipientsByRole(tx, "engineer");
        const notice = composeRunStalled({ runNumber: run.runNumber, runId: run.runId, hours, lastArrival: run.samplesArrivedAt.toISOString().replace("T", " ").slice(0, 16), lastCycle: run.lastCycle });
        const queued = await enqueueMail(tx, {
          kind: "run-stalled",
          recipients: [run.operatorEmail, ...engineers],
          ...notice,
          entityType: "run",
          entityId: run.runId,
          onceKey: `run-stalled:${run.runId}:${run.samplesArrivedAt.toISOString()}`,
        });
        if (queued) noticed.push(run.runId);
      });
  }
  return noticed;
}
