import type { IndexRange, LogColumns } from "@/lib/analysis";
import { formatNumber, type ResolvedPulseStep } from "@/protocols";
import type { Finding } from "./finding";
import { citeProcedure, citeTolerance, formatValue } from "./format-value";
import { createFinding, explainMissingLog, type StepContext } from "./step-context";

/** A level needs this many samples to be told from a transition (lib/analysis pulse-levels minLevelSamples). */
export const samplesToSeeALevel = 3;

/** The median time between samples over a range, s (robust against one long gap). */
export function findSampleInterval(columns: LogColumns, range: IndexRange): number | null {
  const t = columns.timeS;
  const gaps: number[] = [];
  for (let i = range.from + 1; i <= range.to; i++) gaps.push((t[i] as number) - (t[i - 1] as number));
  if (gaps.length === 0) return null;
  gaps.sort((a, b) => a - b);
  return gaps[Math.floor(gaps.length / 2)] as number;
}

/**
 * Why a log cannot show the pulse, or null when it can: sampled every Δ s, a level of P s holds
 * fewer than three samples when Δ > P / 3, so it cannot be told from a switching transition and its
 * end-of-level reading (U2) cannot be taken.
 */
export function explainTooSlowForPulse(step: ResolvedPulseStep, columns: LogColumns, range: IndexRange): string | null {
  const interval = findSampleInterval(columns, range);
  const shortest = Math.min(step.pulseDuration.value, step.baseDuration.value);
  if (interval === null || interval <= shortest / samplesToSeeALevel) return null;
  return (
    `the log was sampled every ${formatValue(interval, "s")}, too slowly to see a level of ${formatValue(shortest, "s")}: ` +
    `it needs at least ${samplesToSeeALevel} samples, one every ${formatNumber(shortest / samplesToSeeALevel, { maxDecimals: 3 })} s or faster`
  );
}

/**
 * The two levels of a DC resistance pulse lasted as programmed, and U1 and U2 were read at the end
 * of each level (IEC 61960-3 7.7: U1 at the end of the 10 s base level, U2 at the end of the 1 s pulse,
 * docs/references.md §4, recalled; the durations are the step's own set-points). The logged duration of a
 * level is from its first sample to its last plus one sample interval; the readings are taken at the
 * level's last sample (lib/analysis/internal-resistance.ts), so the instant of each reading is that
 * duration after the level began. Allowed: the time tolerance or one sample interval, whichever is larger.
 * A log sampled too slowly to show the pulse is not assessable, with the reason.
 */
export function checkPulseTiming(context: StepContext): Finding[] {
  const { step, evidence } = context;
  if (step.kind !== "pulse") return [];
  const tolerance = step.tolerances.timePercent;
  const levels = [
    { field: "base", words: "base level", reading: "U1", programmed: step.baseDuration },
    { field: "pulse", words: "pulse level", reading: "U2", programmed: step.pulseDuration },
  ] as const;
  return levels.map(({ field, words, reading, programmed }) => {
    const draft = {
      rule: "pulse-timing" as const,
      field,
      title: `${words[0]?.toUpperCase()}${words.slice(1)} lasted as programmed, ${reading} read at its end`,
      expected: {
        text: `${programmed.explanation}, ${reading} read at the end of the level; allowed ${tolerance.value} % or one sample interval, whichever is larger`,
        value: programmed.value,
        unit: "s" as const,
      },
      clause: `${citeProcedure(context.citation, `${words} duration`)}; ${citeTolerance(tolerance)}`,
    };
    const missing = explainMissingLog(evidence);
    if (missing !== null || evidence.kind !== "found") return createFinding(context, { ...draft, observed: { text: missing ?? "no log phase" }, outcome: "not assessable" });
    const tooSlow = explainTooSlowForPulse(step, evidence.columns, evidence.phase);
    if (tooSlow !== null) return createFinding(context, { ...draft, observed: { text: tooSlow }, outcome: "not assessable" });
    if (evidence.dcResistance === null) {
      return createFinding(context, { ...draft, observed: { text: "no two-level pulse was found in the logged phase" }, outcome: "deviates" });
    }
    const range = field === "base" ? evidence.dcResistance.base : evidence.dcResistance.pulse;
    const interval = findSampleInterval(evidence.columns, evidence.phase) ?? 0;
    const t = evidence.columns.timeS;
    const logged = (t[range.to] as number) - (t[range.from] as number) + interval;
    const allowed = Math.max((programmed.value * tolerance.value) / 100, interval);
    return createFinding(context, {
      ...draft,
      expected: { ...draft.expected, min: programmed.value - allowed, max: programmed.value + allowed },
      observed: {
        text: `the ${words} lasted ${formatValue(logged, "s")} (${formatNumber(range.to - range.from + 1)} samples, one every ${formatValue(interval, "s")}); ${reading} read at its last sample, ${formatValue(logged, "s")} after it began`,
        value: logged,
        unit: "s",
      },
      outcome: Math.abs(logged - programmed.value) <= allowed ? "meets" : "deviates",
    });
  });
}
