import "server-only";
import { getDb } from "@/db";
import { getRunCycleState, getRunRatedCapacityMAh, listRunCycleResults } from "@/db/run-cycles";
import { getRun } from "@/db/runs";
import { estimateStopCycle, findStopCycle, toRetentionPoints } from "@/lib/analysis";
import { readCycleTrendLimits } from "./cycle-trend-limits";
import type { CycleTrendView } from "./cycle-trend-view";

/** The run's per-cycle trend as the run page and its polling read it; null for an unknown run. */
export async function readCycleTrend(runId: string): Promise<CycleTrendView | null> {
  const db = getDb();
  const [run, rated, stored, state] = await Promise.all([getRun(db, runId), getRunRatedCapacityMAh(db, runId), listRunCycleResults(db, runId), getRunCycleState(db, runId)]);
  if (!run) return null;
  const limits = readCycleTrendLimits(run.resolution, rated);
  const ratedMAh = limits?.ratedCapacityMAh ?? null;
  const points = ratedMAh ? toRetentionPoints(stored, ratedMAh) : [];
  const rows = stored.map((c, k) => ({
    cycle: c.cycle,
    dischargeMAh: c.dischargeAh * 1000,
    chargeMAh: c.chargeAh * 1000,
    retentionPercent: points[k]?.retentionPercent ?? Number.NaN,
    coulombicEfficiencyPercent: c.coulombicEfficiency === null ? null : c.coulombicEfficiency * 100,
    energyEfficiencyPercent: c.energyEfficiency === null ? null : c.energyEfficiency * 100,
    dischargeWh: c.dischargeWh,
    endOfChargeV: c.endOfChargeV,
    endOfDischargeV: c.endOfDischargeV,
    dcResistanceMOhm: c.dcResistanceOhm === null ? null : c.dcResistanceOhm * 1000,
    closed: c.closed,
  }));
  const stop = limits?.stop ?? null;
  const reached = stop ? findStopCycle(points, stop) : null;
  let estimate: CycleTrendView["estimate"] = null;
  if (stop && !reached) {
    const e = estimateStopCycle(points, stop.stopBelowPercentOfRated);
    if (e.kind === "estimate") estimate = { cycle: e.cycle, fit: e.fit };
    else if (e.kind === "not-fading") estimate = { cycle: null, why: "the capacity is not falling over the latest cycles", fit: e.fit };
    else estimate = { cycle: null, why: `a trend needs at least ${e.needed} cycles (${e.have} so far)`, fit: null };
  }
  return {
    ratedCapacityMAh: ratedMAh,
    stop: stop ? { ...stop, source: `${run.procedure.code} version ${run.procedure.number}` } : null,
    rows,
    stopReached: reached
      ? {
          cycle: reached.cycle,
          words: reached.kind === "below-share" ? `discharge capacity ${reached.retentionPercent.toFixed(1)} % of rated, below ${stop?.stopBelowPercentOfRated} %` : `the limit of ${stop?.maxCycles} cycles`,
        }
      : null,
    estimate,
    sampleCount: state?.sampleCount ?? 0,
    samplesArrivedAt: state ? state.samplesArrivedAt.toISOString() : null,
  };
}
