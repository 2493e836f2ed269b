import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { checkLogColumns } from "./check-log-columns";
import type { IndexRange } from "./index-range";
import type { LogColumns } from "./log-columns";
import { findPulseLevels, type PulseLevelOptions, type PulseLevels } from "./pulse-levels";

export interface SegmentOptions {
  /** |I| at or below this is rest, amperes. Keep it under the smallest CV termination current. */
  restCurrentA: number;
  /** A run of fewer samples is a glitch and merges into its neighbours (a real pulse needs at least this many). */
  minPhaseSamples: number;
  /** A run shorter than this is also a glitch, seconds; 0 turns the duration test off. */
  minPhaseDurationS: number;
  /** A charge sample within this below the CV plateau (the charge's final voltage) sits on it, volts. */
  cvVoltageToleranceV: number;
  /** The CV part must end with a current at least this fraction below its first current. */
  cvMinCurrentDrop: number;
  /** How current levels are told apart when looking for a two-level pulse inside a phase. */
  pulse: Partial<PulseLevelOptions>;
}

/** Our own defaults, sized for cells of about 0.5 Ah to 10 Ah logged at 0.1 s to 10 s. */
export const defaultSegmentOptions: SegmentOptions = {
  restCurrentA: 0.01,
  minPhaseSamples: 3,
  minPhaseDurationS: 0,
  cvVoltageToleranceV: 0.01,
  cvMinCurrentDrop: 0.2,
  pulse: {},
};

interface PhaseSpan extends IndexRange {
  /** Time of the first and last sample, seconds. */
  startS: number;
  endS: number;
}

export interface RestPhase extends PhaseSpan {
  kind: "rest";
}

export interface ChargePhase extends PhaseSpan {
  kind: "charge";
  /** The constant-current part, or null for a charge that starts on the voltage plateau. */
  constantCurrent: IndexRange | null;
  /** The constant-voltage part (voltage on its plateau, current decaying), or null for a CC-only charge. */
  constantVoltage: IndexRange | null;
  pulse: PulseLevels | null;
}

export interface DischargePhase extends PhaseSpan {
  kind: "discharge";
  pulse: PulseLevels | null;
}

export type Phase = RestPhase | ChargePhase | DischargePhase;
export type PhaseKind = Phase["kind"];

const kinds: readonly PhaseKind[] = ["rest", "charge", "discharge"];

/**
 * Splits a log into charge, discharge and rest phases by the sign and size of the current
 * (positive charging), in one pass over the samples. Runs shorter than the glitch limits merge
 * into the phase before them (or after them at the start of the log), and neighbours of the same
 * kind then join. Phases cover the log without gaps, as inclusive index ranges.
 */
export function segment(columns: LogColumns, options: Partial<SegmentOptions> = {}): AnalysisResult<Phase[]> {
  const problem = checkLogColumns(columns);
  if (problem) return { ok: false, error: problem };
  const settings = { ...defaultSegmentOptions, ...options };
  const optionProblem = checkSegmentOptions(settings);
  if (optionProblem) return fail("invalid-input", optionProblem);
  const { length: n, timeS: t, currentA: c } = columns;
  if (n === 0) return fail("invalid-input", "The log has no samples.");

  const threshold = settings.restCurrentA;
  const kindIndexOf = (x: number) => (x > threshold ? 1 : x < -threshold ? 2 : 0);
  const spans: { kind: number; from: number; to: number }[] = [];
  let pendingFrom: number | null = null;
  let longestShort = { kind: 0, samples: 0 };

  const emit = (kind: number, from: number, to: number) => {
    const samples = to - from + 1;
    const last = spans[spans.length - 1];
    const isGlitch = samples < settings.minPhaseSamples || (t[to] as number) - (t[from] as number) < settings.minPhaseDurationS;
    if (isGlitch) {
      if (samples > longestShort.samples) longestShort = { kind, samples };
      if (last) last.to = to;
      else pendingFrom ??= from;
    } else if (last && last.kind === kind) {
      last.to = to;
    } else {
      spans.push({ kind, from: pendingFrom ?? from, to });
      pendingFrom = null;
    }
  };

  let runKind = kindIndexOf(c[0] as number);
  let runFrom = 0;
  let tPrev = t[0] as number;
  if (!Number.isFinite(tPrev)) return fail("non-finite-value", "Time at sample 0 is not a number.");
  for (let i = 1; i < n; i++) {
    const ti = t[i] as number;
    if (!(ti > tPrev)) return fail("time-not-increasing", `Time does not increase at sample ${i} (${tPrev} s → ${ti} s).`);
    tPrev = ti;
    const kind = kindIndexOf(c[i] as number);
    if (kind !== runKind) {
      emit(runKind, runFrom, i - 1);
      runKind = kind;
      runFrom = i;
    }
  }
  emit(runKind, runFrom, n - 1);
  if (spans.length === 0) spans.push({ kind: longestShort.kind, from: 0, to: n - 1 });

  return succeed(spans.map((span) => describePhase(columns, span.from, span.to, kinds[span.kind] as PhaseKind, settings)));
}

function checkSegmentOptions(o: SegmentOptions): string | null {
  if (!(o.restCurrentA >= 0)) return "The rest current threshold must be zero or more.";
  if (!Number.isInteger(o.minPhaseSamples) || o.minPhaseSamples < 1) return "The shortest phase must be a whole number of samples, at least 1.";
  if (!(o.minPhaseDurationS >= 0)) return "The shortest phase duration must be zero or more.";
  if (!(o.cvVoltageToleranceV > 0)) return "The CV voltage tolerance must be above zero.";
  if (!(o.cvMinCurrentDrop > 0 && o.cvMinCurrentDrop < 1)) return "The CV current drop must lie between 0 and 1.";
  return null;
}

function describePhase(columns: LogColumns, from: number, to: number, kind: PhaseKind, o: SegmentOptions): Phase {
  const span = { from, to, startS: columns.timeS[from] as number, endS: columns.timeS[to] as number };
  const pulseOf = () => {
    const found = findPulseLevels(columns, span, { minLevelSamples: o.minPhaseSamples, ...o.pulse });
    return found.ok ? found.value : null;
  };
  switch (kind) {
    case "rest":
      return { kind, ...span };
    case "discharge":
      return { kind, ...span, pulse: pulseOf() };
    case "charge":
      return { kind, ...span, ...splitConstantVoltage(columns, span, o), pulse: pulseOf() };
    default: {
      const unknown: never = kind;
      throw new Error(`Unknown phase kind ${String(unknown)}`);
    }
  }
}

/** Samples at the end of a charge whose median voltage stands for the CV plateau. */
const plateauSamples = 25;

/**
 * The CV part of a charge: the trailing samples whose voltage sits within the tolerance of the
 * plateau, provided the current fell over them. The plateau is the median voltage of the last
 * charge samples, so noise spikes do not move it; the CV part starts after the last run of
 * minPhaseSamples samples below the plateau band, so a lone noisy dip does not cut it short.
 * Trailing samples at rest current (a glitch merged in) belong to neither part, so the last CV
 * sample carries the termination current.
 */
function splitConstantVoltage(
  columns: LogColumns,
  range: IndexRange,
  o: SegmentOptions,
): Pick<ChargePhase, "constantCurrent" | "constantVoltage"> {
  const { voltageV: v, currentA: c } = columns;
  let last = range.to;
  while (last > range.from && (c[last] as number) <= o.restCurrentA) last--;
  const tail = Array.from(v.subarray(Math.max(range.from, last - plateauSamples + 1), last + 1)).sort((a, b) => a - b);
  const plateau = tail[tail.length >> 1] as number;
  const band = plateau - o.cvVoltageToleranceV;
  let first = range.from;
  let below = 0;
  for (let i = last; i >= range.from; i--) {
    below = (v[i] as number) < band ? below + 1 : 0;
    if (below === o.minPhaseSamples) {
      first = i + below;
      break;
    }
  }
  const decayed = Math.abs(c[last] as number) <= (1 - o.cvMinCurrentDrop) * Math.abs(c[first] as number);
  if (last - first + 1 < o.minPhaseSamples || !decayed) {
    return { constantCurrent: { from: range.from, to: last }, constantVoltage: null };
  }
  return {
    constantCurrent: first > range.from ? { from: range.from, to: first - 1 } : null,
    constantVoltage: { from: first, to: last },
  };
}
