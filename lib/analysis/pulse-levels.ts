import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { checkLogColumns } from "./check-log-columns";
import { checkIndexRange, type IndexRange } from "./index-range";
import type { LogColumns } from "./log-columns";

export interface PulseLevelOptions {
  /** A new current level starts when the current leaves the running level mean by more than this fraction of it. */
  levelChangeRatio: number;
  /** …and by more than this many amperes, so a level near zero current does not split on noise. */
  minLevelStepA: number;
  /** Runs with fewer samples are transitions between levels, not levels. */
  minLevelSamples: number;
}

export const defaultPulseLevelOptions: PulseLevelOptions = {
  levelChangeRatio: 0.25,
  minLevelStepA: 0.01,
  minLevelSamples: 3,
};

/** The two current levels of a DC resistance pulse: the base level and the higher pulse level after it. */
export interface PulseLevels {
  base: IndexRange;
  pulse: IndexRange;
  baseMeanCurrentA: number;
  pulseMeanCurrentA: number;
}

interface Level {
  from: number;
  to: number;
  meanA: number;
}

/**
 * Finds the first two-level pulse in a log slice: a steady current level (the base, which may be
 * a rest) followed by a level of the same direction and larger magnitude that lasts no longer than
 * the base. Short runs between levels (the cycler's current ramp) are skipped. One pass, constant
 * memory. A gradually decaying current (CV charge) forms falling levels, never a pulse.
 */
export function findPulseLevels(
  columns: LogColumns,
  range: IndexRange,
  options: Partial<PulseLevelOptions> = {},
): AnalysisResult<PulseLevels> {
  const problem = checkLogColumns(columns) ?? checkIndexRange(range, columns.length);
  if (problem) return { ok: false, error: problem };
  const settings = { ...defaultPulseLevelOptions, ...options };
  if (!(settings.levelChangeRatio > 0) || !(settings.minLevelStepA >= 0) || !(settings.minLevelSamples >= 1)) {
    return fail("invalid-input", "Pulse level options must be positive.");
  }
  const { timeS: t, currentA: c } = columns;
  const { levelChangeRatio: ratio, minLevelStepA: minStep, minLevelSamples: minSamples } = settings;
  const durationOf = (level: Level) => (t[level.to] as number) - (t[level.from] as number);
  const isPulseAfter = (base: Level, pulse: Level) => {
    const rise = Math.abs(pulse.meanA) - Math.abs(base.meanA);
    const sameDirection = Math.abs(base.meanA) <= minStep || Math.sign(base.meanA) === Math.sign(pulse.meanA);
    return rise > Math.max(ratio * Math.abs(base.meanA), minStep) && sameDirection && durationOf(pulse) <= durationOf(base);
  };

  // Plain locals in the loop (no closure over them), so the hot path stays in registers.
  let previous: Level | null = null;
  let levelFrom = range.from;
  let sum = c[range.from] as number;
  let count = 1;
  for (let i = range.from + 1; i <= range.to + 1; i++) {
    const atEnd = i > range.to;
    const x = atEnd ? 0 : (c[i] as number);
    // |x − mean| ≤ max(ratio·|mean|, minStep), multiplied through by count to spare a division per sample.
    const limit = ratio * Math.abs(sum);
    const floor = minStep * count;
    if (!atEnd && Math.abs(x * count - sum) <= (limit > floor ? limit : floor)) {
      sum += x;
      count++;
      continue;
    }
    // The level ending at i − 1 is complete; runs too short to be a level are skipped.
    if (count >= minSamples) {
      const level = { from: levelFrom, to: i - 1, meanA: sum / count };
      if (previous && isPulseAfter(previous, level)) {
        return succeed({ base: { from: previous.from, to: previous.to }, pulse: { from: level.from, to: level.to }, baseMeanCurrentA: previous.meanA, pulseMeanCurrentA: level.meanA });
      }
      previous = level;
    }
    levelFrom = i;
    sum = x;
    count = 1;
  }
  return fail("no-pulse-found", `No base level followed by a higher, shorter pulse level between samples ${range.from} and ${range.to}.`);
}
