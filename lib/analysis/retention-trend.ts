import { linearRegression, linearRegressionLine, rSquared } from "simple-statistics";

/** One cycle's discharge capacity as a share of rated. */
export interface RetentionPoint {
  cycle: number;
  /** Discharge capacity / rated capacity × 100 %. */
  retentionPercent: number;
}

export interface StopCriterion {
  /** Stop when a checked cycle's retention falls below this, % of rated. */
  stopBelowPercentOfRated: number;
  /** Only every so many cycles are capacity checks (1: every cycle). */
  checkEveryCycles: number;
  /** …or stop after this many cycles (null: no cycle limit). */
  maxCycles: number | null;
}

export type StopReason = { cycle: number; kind: "below-share"; retentionPercent: number } | { cycle: number; kind: "cycle-limit" };

export interface RetentionFit {
  /** Ordinary least squares of retention on cycle number over the cycles named (simple-statistics' linearRegression). */
  slopePercentPerCycle: number;
  interceptPercent: number;
  rSquared: number;
  fromCycle: number;
  toCycle: number;
  points: number;
}

export type StopEstimate =
  | { kind: "estimate"; cycle: number; fit: RetentionFit }
  | { kind: "not-fading"; fit: RetentionFit }
  | { kind: "too-few-cycles"; needed: number; have: number };

/** Retention per cycle: Q_discharge / C_rated × 100 % (the share of rated an endurance criterion is written in). */
export function toRetentionPoints(cycles: readonly { cycle: number; dischargeAh: number }[], ratedCapacityMAh: number): RetentionPoint[] {
  return cycles.map((c) => ({ cycle: c.cycle, retentionPercent: ((c.dischargeAh * 1000) / ratedCapacityMAh) * 100 }));
}

/**
 * The first cycle where the stop criterion is met: a checked cycle (every `checkEveryCycles`-th) whose
 * retention is below the stop share, or the cycle limit reached, whichever comes first.
 */
export function findStopCycle(points: readonly RetentionPoint[], criterion: StopCriterion): StopReason | null {
  for (const p of points) {
    if (p.cycle % Math.max(1, criterion.checkEveryCycles) === 0 && p.retentionPercent < criterion.stopBelowPercentOfRated) {
      return { cycle: p.cycle, kind: "below-share", retentionPercent: p.retentionPercent };
    }
    if (criterion.maxCycles !== null && p.cycle >= criterion.maxCycles) return { cycle: p.cycle, kind: "cycle-limit" };
  }
  return null;
}

/** Fewest cycles a straight line is fitted through; fewer say nothing about a trend. */
export const MIN_FIT_CYCLES = 5;
/** The line is fitted through the latest cycles only, since fade is seldom straight over a whole life. */
export const FIT_LAST_CYCLES = 100;

/**
 * An estimate of the cycle where retention will cross the stop share: a straight line fitted by least
 * squares to the latest cycles (at most FIT_LAST_CYCLES), solved for retention = stop share; the estimate is
 * the first whole cycle past that point. An extrapolation, not a measurement: the caller shows it as an estimate, with the fit.
 */
export function estimateStopCycle(points: readonly RetentionPoint[], stopBelowPercentOfRated: number, lastCycles = FIT_LAST_CYCLES): StopEstimate {
  if (points.length < MIN_FIT_CYCLES) return { kind: "too-few-cycles", needed: MIN_FIT_CYCLES, have: points.length };
  const used = points.slice(-lastCycles);
  const data = used.map((p) => [p.cycle, p.retentionPercent] as [number, number]);
  const { m, b } = linearRegression(data);
  const fit: RetentionFit = {
    slopePercentPerCycle: m,
    interceptPercent: b,
    rSquared: rSquared(data, linearRegressionLine({ m, b })),
    fromCycle: (used[0] as RetentionPoint).cycle,
    toCycle: (used[used.length - 1] as RetentionPoint).cycle,
    points: used.length,
  };
  if (!(m < 0)) return { kind: "not-fading", fit };
  const crossing = (stopBelowPercentOfRated - b) / m;
  // "Below" the share: the first whole cycle past the crossing (a cycle exactly on it is not below; the
  // 1e-9 keeps rounding noise from moving it), never one already measured.
  return { kind: "estimate", cycle: Math.max(Math.floor(crossing + 1e-9) + 1, fit.toCycle + 1), fit };
}
