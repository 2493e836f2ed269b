import type { StepContext, TimeSpan } from "./step-context";
import type { StepRecord } from "./step-record";

/** The record's start and end in ms since 1970, or why they cannot be used. */
export function readRecordTimes(record: StepRecord | null): { startMs: number; endMs: number } | { reason: string } {
  if (record === null) return { reason: "no step record" };
  if (record.startedAt === undefined || record.endedAt === undefined) return { reason: "the start or end time was not recorded" };
  // The schema admits only ISO times with a zone, so parsing does not depend on the machine's zone.
  const startMs = Date.parse(record.startedAt);
  const endMs = Date.parse(record.endedAt);
  if (!Number.isFinite(startMs) || !Number.isFinite(endMs)) return { reason: "the recorded times cannot be read" };
  if (endMs < startMs) return { reason: "the recorded end is before the recorded start" };
  return { startMs, endMs };
}

/**
 * Where the step lies in time. The log is the lab's evidence, so a matched phase wins; otherwise
 * the recorded times, moved onto the log's time base when the log's start time is known.
 */
export function findTimeSpan(context: StepContext): TimeSpan | { reason: string } {
  const { evidence } = context;
  if (evidence.kind === "found") {
    return { startS: evidence.phase.startS, endS: evidence.phase.endS, base: "log", source: "log" };
  }
  const times = readRecordTimes(context.record);
  if ("reason" in times) return times;
  const originMs = context.logStartMs ?? 0;
  return {
    startS: (times.startMs - originMs) / 1000,
    endS: (times.endMs - originMs) / 1000,
    base: context.logStartMs === null ? "clock" : "log",
    source: "record",
  };
}
