import "server-only";
import type { Executor } from "@/db";
import { deleteRunCycles, getRunCycleState, getRunRatedCapacityMAh, listRunCycleResults, saveRunCycleState, upsertRunCycleResults } from "@/db/run-cycles";
import type { RunView } from "@/db/runs";
import { createCycleAccumulator, findStopCycle, toRetentionPoints, type CycleAccumulator, type CycleAccumulatorState, type StopReason } from "@/lib/analysis";
import { enqueueMail, listRecipientsByRole } from "@/lib/mail/enqueue-mail";
import { composeEnduranceStopReached } from "@/lib/mail/messages";
import { DomainError } from "@/lib/errors";
import { readCycleTrendLimits, type CycleTrendLimits } from "./cycle-trend-limits";

/**
 * How a log's samples meet the run's cycles: a whole log starts them afresh (its cycles replace those of
 * the log before it); a log part continues the saved state, its clock moved on by `timeOffsetS`.
 */
export type CycleMode = { kind: "whole-log" } | { kind: "part"; timeOffsetS: number };

export interface RunCycles {
  mode: CycleMode;
  accumulator: CycleAccumulator;
  /** The cycle where the stop criterion was already met, from an earlier part. */
  stopReachedCycle: number | null;
  /** Offset added to the samples' times. */
  timeOffsetS: number;
}

/**
 * Opens the run's per-cycle accumulator inside the transaction that will store the samples. A part
 * takes the saved state with a row lock, so parts of one run are accumulated one after the other.
 */
export async function openRunCycles(tx: Executor, runId: string, mode: CycleMode): Promise<RunCycles> {
  const saved = mode.kind === "part" ? await getRunCycleState(tx, runId, { forUpdate: true }) : null;
  const acc = createCycleAccumulator({}, saved ? (saved.state as CycleAccumulatorState) : undefined);
  if (!acc.ok) throw new DomainError("conflict", acc.error.message);
  return { mode, accumulator: acc.value, stopReachedCycle: saved?.stopReachedCycle ?? null, timeOffsetS: mode.kind === "part" ? mode.timeOffsetS : 0 };
}

/**
 * Writes what the samples just stored gave: the cycles reported, the accumulator's state, and, the first
 * time a checked cycle meets the stop criterion, that cycle and a notice to the operator and engineers
 * (once per run: the outbox's once-key). Same transaction as the samples (the caller's).
 */
export async function storeRunCycles(tx: Executor, input: { run: RunView; runLogId: string; cycles: RunCycles; limits?: CycleTrendLimits | null }): Promise<{ stop: StopReason | null }> {
  const { run, runLogId, cycles } = input;
  if (cycles.mode.kind === "whole-log") await deleteRunCycles(tx, run.id);
  await upsertRunCycleResults(tx, run.id, runLogId, cycles.accumulator.takeResults());
  const limits = input.limits !== undefined ? input.limits : readCycleTrendLimits(run.resolution, await getRunRatedCapacityMAh(tx, run.id));
  let stopReachedCycle = cycles.stopReachedCycle;
  let stop: StopReason | null = null;
  if (stopReachedCycle === null && limits?.stop) {
    const stored = await listRunCycleResults(tx, run.id);
    stop = findStopCycle(toRetentionPoints(stored, limits.ratedCapacityMAh), limits.stop);
    if (stop) {
      stopReachedCycle = stop.cycle;
      await noticeStopReached(tx, run, stop, limits);
    }
  }
  const state = cycles.accumulator.saveState();
  await saveRunCycleState(tx, { runId: run.id, runLogId, state, sampleCount: state.samples, lastSampleTimeS: cycles.accumulator.lastTimeS, stopReachedCycle });
  return { stop };
}

async function noticeStopReached(tx: Executor, run: RunView, stop: StopReason, limits: CycleTrendLimits): Promise<void> {
  const operator = await tx.selectFrom("app_user").select("email").where("id", "=", run.operator.id).executeTakeFirst();
  const engineers = await listRecipientsByRole(tx, "engineer");
  const reason =
    stop.kind === "below-share"
      ? `discharge capacity ${stop.retentionPercent.toFixed(1)} % of rated (${limits.ratedCapacityMAh} mAh), below the stop share of ${limits.stop?.stopBelowPercentOfRated} %`
      : `the procedure's limit of ${limits.stop?.maxCycles} cycles was reached`;
  const notice = composeEnduranceStopReached({ runNumber: run.number, runId: run.id, specimen: run.specimen.identifier, cycle: stop.cycle, reason });
  await enqueueMail(tx, {
    kind: "endurance-stop-reached",
    recipients: [...(operator ? [operator.email] : []), ...engineers],
    ...notice,
    entityType: "run",
    entityId: run.id,
    onceKey: `endurance-stop:${run.id}`,
  });
}
