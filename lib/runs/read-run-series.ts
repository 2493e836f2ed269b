import "server-only";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { getLatestRunEvaluation, readChannelRange, readChannelSamples, type ChannelArrays, type LogChannel } from "@/db/run-series";
import { DomainError } from "@/lib/errors";
import { accumulateCapacityAh, planSeriesRead, thinChannels } from "./plan-series-read";
import type { CapacitySeriesView, SeriesStepBand, TimeSeriesView } from "./run-series-view";

async function readPlanned(runLogId: string, channels: LogChannel[], plan: ReturnType<typeof planSeriesRead>): Promise<ChannelArrays> {
  switch (plan.kind) {
    case "every-sample":
      return readChannelRange(getDb(), { runLogId, channels, from: plan.from, to: plan.to });
    case "strided":
      return readChannelSamples(getDb(), { runLogId, channels, indexes: plan.indexes });
    default: {
      const never: never = plan;
      return never;
    }
  }
}

async function getLogAndSteps(runId: string) {
  const [log, stored] = await Promise.all([getCurrentRunLog(getDb(), runId), getLatestRunEvaluation(getDb(), runId)]);
  if (!log) throw new DomainError("not-found", "This run has no data log yet.");
  // Written only by evaluateStoredRun; steps are placed on this log only if it was the one evaluated.
  const evaluation = stored && stored.runLogId === log.id ? stored.evaluation : null;
  return { log, steps: evaluation?.steps ?? [] };
}

/** The whole log's V, I and T against time, thinned to about `points`, with the steps to shade. */
export async function readRunTimeSeries(runId: string, points: number): Promise<TimeSeriesView> {
  const { log, steps } = await getLogAndSteps(runId);
  const plan = planSeriesRead({ from: 0, to: log.sampleCount - 1, points });
  const c = await readPlanned(log.id, ["time_s", "voltage_v", "current_a", "temperature_c"], plan);
  const thinned = thinChannels(c.time_s!, c.voltage_v!, { current: c.current_a, temperature: c.temperature_c }, points);
  const bands: SeriesStepBand[] = steps.flatMap((s) =>
    s.logPhase ? [{ stepId: s.stepId, cycle: s.cycle, label: s.label, kind: s.kind, startS: s.logPhase.startS, endS: s.logPhase.endS }] : [],
  );
  return {
    kind: "time",
    sampleCount: log.sampleCount,
    read: plan.kind,
    timeS: thinned.x,
    voltageV: thinned.y,
    currentA: thinned.others.current ?? [],
    temperatureC: thinned.others.temperature ?? null,
    steps: bands,
  };
}

/** One discharge's voltage against the charge it delivered, thinned to about `points`. */
export async function readRunCapacitySeries(runId: string, q: { stepId: string; cycle: number; points: number }): Promise<CapacitySeriesView> {
  const { log, steps } = await getLogAndSteps(runId);
  const step = steps.find((s) => s.stepId === q.stepId && s.cycle === q.cycle);
  if (!step) throw new DomainError("not-found", `No evaluated step "${q.stepId}" (cycle ${q.cycle}) on this run's current log.`);
  if (!step.logPhase) throw new DomainError("not-found", `Step "${step.label}" has no stretch of the log: ${step.logNote ?? "none was found"}.`);
  const { from, to } = step.logPhase;
  // Q needs every sample of the step (an integral), so the whole stretch is read, then thinned.
  const c = await readChannelRange(getDb(), { runLogId: log.id, channels: ["time_s", "voltage_v", "current_a"], from, to });
  const capacityAh = accumulateCapacityAh(c.time_s!, c.current_a!);
  const thinned = thinChannels(capacityAh.map((q) => q * 1000), c.voltage_v!, {}, q.points);
  return {
    kind: "capacity",
    stepId: step.stepId,
    cycle: step.cycle,
    label: step.label,
    sampleCount: to - from + 1,
    read: "every-sample",
    capacityMAh: thinned.x,
    voltageV: thinned.y,
  };
}
