import { z } from "zod";
import { fail, succeed, type AnalysisResult } from "./analysis-result";
import { computeDcResistance } from "./internal-resistance";
import type { LogColumns } from "./log-columns";
import { defaultPulseLevelOptions, type PulseLevelOptions } from "./pulse-levels";
import { defaultSegmentOptions } from "./segment";

/** One charge/discharge cycle's results, as the accumulator hands them out. */
export interface CycleResult {
  /** 1 for the cycle that begins with the log's first charge; a new cycle begins at each charge after a discharge. */
  cycle: number;
  /** Q = ∫|I| dt over the cycle's charge phases, Ah (docs/references.md §5). */
  chargeAh: number;
  /** Q = ∫|I| dt over the cycle's discharge phases, Ah. */
  dischargeAh: number;
  /** E = ∫V·|I| dt over the charge phases, Wh (docs/references.md §5). */
  chargeWh: number;
  /** E = ∫V·|I| dt over the discharge phases, Wh. */
  dischargeWh: number;
  /** Ampere-hour (coulombic) efficiency Q_discharge / Q_charge (docs/references.md §19); null without charge. */
  coulombicEfficiency: number | null;
  /** Watt-hour (energy) efficiency E_discharge / E_charge (docs/references.md §19); null without charge. */
  energyEfficiency: number | null;
  /** Voltage at the last sample of the cycle's last charge phase, V. */
  endOfChargeV: number | null;
  /** Voltage at the last sample of the cycle's last discharge phase, V. */
  endOfDischargeV: number | null;
  /** Rdc from the first two-level pulse inside a discharge phase of the cycle, ohms (IEC 61960-3 7.7, docs/references.md §4). */
  dcResistanceOhm: number | null;
  /** Time of the cycle's first and last sample, seconds on the accumulator's time line. */
  firstTimeS: number;
  lastTimeS: number;
  /** True once the next cycle's charge has begun: the cycle's results no longer change. */
  closed: boolean;
}

export interface CycleAccumulatorOptions {
  /** |I| at or below this is rest, amperes (as in segment()). */
  restCurrentA: number;
  /** A run of fewer samples of another kind is a glitch and stays in the phase before it (as in segment()). */
  minPhaseSamples: number;
  pulse: PulseLevelOptions;
}

export const defaultCycleAccumulatorOptions: CycleAccumulatorOptions = {
  restCurrentA: defaultSegmentOptions.restCurrentA,
  minPhaseSamples: defaultSegmentOptions.minPhaseSamples,
  pulse: { ...defaultPulseLevelOptions, minLevelSamples: defaultSegmentOptions.minPhaseSamples },
};

/** Phase kinds as small numbers in the hot loop: none yet, rest, charge, discharge. */
const NONE = -1;
const REST = 0;
const CHARGE = 1;
const DISCHARGE = 2;

/** Bumped whenever the saved shape changes; a state of another version is refused, not guessed at. */
export const CYCLE_STATE_VERSION = 1;

const finite = z.number().refine(Number.isFinite, "not a finite number");
const nullableFinite = finite.nullable();

const levelSchema = z.object({ fromS: finite, toS: finite, meanA: finite, endV: finite, endA: finite });

const cycleSumsSchema = z.object({
  cycle: z.number().int().min(1),
  q: z.array(finite).length(4),
  e: z.array(finite).length(4),
  endOfChargeV: nullableFinite,
  endOfDischargeV: nullableFinite,
  dcResistanceOhm: nullableFinite,
  firstTimeS: finite,
  lastTimeS: finite,
  hasDischarge: z.boolean(),
});

/** Everything the accumulator needs to carry on where it stopped: a few dozen numbers, whatever the log's length. */
export const cycleAccumulatorStateSchema = z.object({
  version: z.literal(CYCLE_STATE_VERSION),
  options: z.object({
    restCurrentA: z.number().min(0),
    minPhaseSamples: z.number().int().min(1).max(1000),
    pulse: z.object({ levelChangeRatio: z.number().positive(), minLevelStepA: z.number().min(0), minLevelSamples: z.number().int().min(1) }),
  }),
  samples: z.number().int().min(0),
  last: z.object({ t: finite, v: finite, c: finite }).nullable(),
  phase: z.object({
    kind: z.number().int().min(-1).max(2),
    level: z.object({ fromS: finite, sum: finite, count: z.number().int().min(0), endS: finite, endV: finite, endA: finite }).nullable(),
    previousLevel: levelSchema.nullable(),
    pulseFound: z.boolean(),
  }),
  pending: z.object({ kind: z.number().int().min(-1).max(2), t: z.array(finite), v: z.array(finite), c: z.array(finite) }),
  open: cycleSumsSchema.nullable(),
  lastCycle: z.number().int().min(0),
  unreported: z.array(
    z.object({
      cycle: z.number().int().min(1),
      chargeAh: finite,
      dischargeAh: finite,
      chargeWh: finite,
      dischargeWh: finite,
      coulombicEfficiency: nullableFinite,
      energyEfficiency: nullableFinite,
      endOfChargeV: nullableFinite,
      endOfDischargeV: nullableFinite,
      dcResistanceOhm: nullableFinite,
      firstTimeS: finite,
      lastTimeS: finite,
      closed: z.boolean(),
    }),
  ),
});

export type CycleAccumulatorState = z.infer<typeof cycleAccumulatorStateSchema>;

type CycleSums = z.infer<typeof cycleSumsSchema>;

export interface CycleAccumulator {
  /**
   * Feeds the next samples (time must keep increasing across calls). `timeOffsetS` is added to every time
   * of this chunk, so a log part whose clock starts at zero continues the run's time line.
   */
  push(columns: LogColumns, timeOffsetS?: number): AnalysisResult<void>;
  /**
   * The cycles closed since the last call, then the open cycle if its discharge has ended (it may still
   * change: a later call hands it out again, updated). Closed cycles are forgotten once taken.
   */
  takeResults(): CycleResult[];
  /** The open cycle as it stands (charge or discharge may still be under way), or null before the first charge. */
  peekOpenCycle(): CycleResult | null;
  /** Samples fed so far. */
  readonly samples: number;
  /** Time of the last sample fed, seconds, or null before the first. */
  readonly lastTimeS: number | null;
  /** The state as plain JSON numbers (doubles survive JSON exactly), for the next log part to continue from. */
  saveState(): CycleAccumulatorState;
}

/**
 * Per-cycle results computed as samples arrive, in one pass and constant memory per open cycle: the
 * streaming form of segment() + integrate() + findPulseLevels() for logs too long to hold (decision 004).
 *
 * Phases follow segment(): a sample is charge when I > restCurrentA, discharge when I < −restCurrentA,
 * rest otherwise; a run of fewer than minPhaseSamples samples of another kind stays in the phase before
 * it, so at most that many samples wait undecided. Within a phase, the trapezoid rule of integrate():
 * Q = Σ Δt·(|I₀| + |I₁|)/2, E = Σ Δt·(V₀|I₀| + V₁|I₁|)/2 (definitions, docs/references.md §5), each term
 * added with Neumaier compensation so a log split anywhere gives the same sums to the last bit. The
 * interval between the last sample of one phase and the first of the next belongs to neither (as in
 * integrate() over each phase's range). A cycle begins at a charge phase that follows a discharge;
 * samples before the log's first charge belong to no cycle (a preparatory discharge).
 * DC resistance: the first base-then-higher-pulse pair of current levels inside a discharge phase, read
 * at the last sample of each level, Rdc = (U1 − U2)/(I1 − I2) (IEC 61960-3 7.7; findPulseLevels' rule).
 */
export function createCycleAccumulator(options: Partial<CycleAccumulatorOptions> = {}, from?: CycleAccumulatorState): AnalysisResult<CycleAccumulator> {
  let state: CycleAccumulatorState;
  if (from) {
    const parsed = cycleAccumulatorStateSchema.safeParse(from);
    if (!parsed.success) return fail("invalid-input", "The saved per-cycle state cannot be read; evaluate the run's cycles again from its first log part.");
    state = structuredClone(parsed.data);
  } else {
    const o = { ...defaultCycleAccumulatorOptions, ...options, pulse: { ...defaultCycleAccumulatorOptions.pulse, ...options.pulse } };
    if (!(o.restCurrentA >= 0) || !Number.isInteger(o.minPhaseSamples) || o.minPhaseSamples < 1 || o.minPhaseSamples > 1000) {
      return fail("invalid-input", "The rest current must be zero or more and the shortest phase a whole number of samples from 1 to 1000.");
    }
    state = {
      version: CYCLE_STATE_VERSION,
      options: o,
      samples: 0,
      last: null,
      phase: { kind: NONE, level: null, previousLevel: null, pulseFound: false },
      pending: { kind: NONE, t: [], v: [], c: [] },
      open: null,
      lastCycle: 0,
      unreported: [],
    };
  }
  return succeed(makeAccumulator(state));
}

function makeAccumulator(s: CycleAccumulatorState): CycleAccumulator {
  const { restCurrentA: threshold, minPhaseSamples } = s.options;
  const { levelChangeRatio: ratio, minLevelStepA: minStep, minLevelSamples } = s.options.pulse;

  function openCycleAt(t: number): void {
    if (s.open) s.unreported.push(toResult(s.open, true));
    s.lastCycle += 1;
    s.open = { cycle: s.lastCycle, q: [0, 0, 0, 0], e: [0, 0, 0, 0], endOfChargeV: null, endOfDischargeV: null, dcResistanceOhm: null, firstTimeS: t, lastTimeS: t, hasDischarge: false };
  }

  /** Ends the open phase: its last current level may complete a pulse. */
  function closePhase(): void {
    closeLevel();
    s.phase = { kind: NONE, level: null, previousLevel: null, pulseFound: false };
  }

  function startPhase(kind: number, t: number): void {
    closePhase();
    s.phase.kind = kind;
    if (kind === CHARGE && (s.open === null || s.open.hasDischarge)) openCycleAt(t);
    if (kind === DISCHARGE && s.open) s.open.hasDischarge = true;
  }

  /** The current level ends; with the level before it, it may be a DC resistance pulse (findPulseLevels' rule). */
  function closeLevel(): void {
    const p = s.phase;
    const l = p.level;
    p.level = null;
    if (!l || p.kind !== DISCHARGE || p.pulseFound || l.count < minLevelSamples) return;
    const level = { fromS: l.fromS, toS: l.endS, meanA: l.sum / l.count, endV: l.endV, endA: l.endA };
    const base = p.previousLevel;
    if (base) {
      const rise = Math.abs(level.meanA) - Math.abs(base.meanA);
      const sameDirection = Math.abs(base.meanA) <= minStep || Math.sign(base.meanA) === Math.sign(level.meanA);
      if (rise > Math.max(ratio * Math.abs(base.meanA), minStep) && sameDirection && level.toS - level.fromS <= base.toS - base.fromS) {
        p.pulseFound = true;
        const r = computeDcResistance({ u1V: base.endV, i1A: base.endA, u2V: level.endV, i2A: level.endA });
        if (r.ok && s.open && s.open.dcResistanceOhm === null) s.open.dcResistanceOhm = r.value;
        return;
      }
    }
    p.previousLevel = level;
  }

  /** Adds one sample to the open phase: the trapezoid from the phase's previous sample, and the level tracker. */
  function addToPhase(t: number, v: number, c: number, continues: boolean): void {
    const kind = s.phase.kind;
    const cycle = s.open;
    if (cycle && (kind === CHARGE || kind === DISCHARGE)) {
      const prev = s.last;
      if (continues && prev) {
        const dt = t - prev.t;
        const a0 = Math.abs(prev.c);
        const a1 = Math.abs(c);
        const k = kind === CHARGE ? 0 : 2;
        addCompensated(cycle.q, k, dt * (a0 + a1));
        addCompensated(cycle.e, k, dt * (prev.v * a0 + v * a1));
      }
      if (kind === CHARGE) cycle.endOfChargeV = v;
      else cycle.endOfDischargeV = v;
    }
    if (cycle) cycle.lastTimeS = t;
    if (kind === DISCHARGE && !s.phase.pulseFound) trackLevel(t, v, c);
    // In place: no object per sample on a log of millions.
    const last = s.last;
    if (last) {
      last.t = t;
      last.v = v;
      last.c = c;
    } else s.last = { t, v, c };
  }

  function trackLevel(t: number, v: number, c: number): void {
    const l = s.phase.level;
    if (l) {
      const limit = ratio * Math.abs(l.sum);
      const floor = minStep * l.count;
      if (Math.abs(c * l.count - l.sum) <= (limit > floor ? limit : floor)) {
        l.sum += c;
        l.count += 1;
        l.endS = t;
        l.endV = v;
        l.endA = c;
        return;
      }
      closeLevel();
      if (s.phase.pulseFound) return;
    }
    s.phase.level = { fromS: t, sum: c, count: 1, endS: t, endV: v, endA: c };
  }

  function flushPending(): void {
    const p = s.pending;
    for (let k = 0; k < p.t.length; k++) addToPhase(p.t[k] as number, p.v[k] as number, p.c[k] as number, true);
    s.pending = { kind: NONE, t: [], v: [], c: [] };
  }

  function push(columns: LogColumns, timeOffsetS = 0): AnalysisResult<void> {
    const { timeS, voltageV, currentA, length: n } = columns;
    if (!Number.isFinite(timeOffsetS)) return fail("invalid-input", "The time offset must be a number.");
    // Check the whole chunk first, so a refused chunk leaves the state as it was.
    let tPrev = s.pending.t.length > 0 ? (s.pending.t[s.pending.t.length - 1] as number) : s.last ? s.last.t : Number.NEGATIVE_INFINITY;
    for (let i = 0; i < n; i++) {
      const t = (timeS[i] as number) + timeOffsetS;
      if (!(t > tPrev)) return fail("time-not-increasing", `Time does not increase at sample ${s.samples + i + 1} (${tPrev} s → ${t} s).`);
      if (!Number.isFinite(voltageV[i] as number) || !Number.isFinite(currentA[i] as number)) return fail("non-finite-value", `A voltage or current at sample ${s.samples + i + 1} is not a number.`);
      tPrev = t;
    }
    for (let i = 0; i < n; i++) {
      const t = (timeS[i] as number) + timeOffsetS;
      const v = voltageV[i] as number;
      const c = currentA[i] as number;
      const kind = c > threshold ? CHARGE : c < -threshold ? DISCHARGE : REST;
      const phaseKind = s.phase.kind;
      if (phaseKind === NONE) {
        startPhase(kind, t);
        addToPhase(t, v, c, false);
      } else if (kind === phaseKind) {
        // A short run of another kind has ended: it was a glitch and stays in this phase.
        if (s.pending.t.length > 0) flushPending();
        addToPhase(t, v, c, true);
      } else {
        if (s.pending.kind !== kind && s.pending.t.length > 0) flushPending();
        const p = s.pending;
        p.kind = kind;
        p.t.push(t);
        p.v.push(v);
        p.c.push(c);
        if (p.t.length >= minPhaseSamples) {
          // Long enough to be a phase of its own: it starts at the run's first sample.
          s.pending = { kind: NONE, t: [], v: [], c: [] };
          startPhase(kind, p.t[0] as number);
          for (let k = 0; k < p.t.length; k++) addToPhase(p.t[k] as number, p.v[k] as number, p.c[k] as number, k > 0);
        }
      }
    }
    s.samples += n;
    return succeed(undefined);
  }

  function takeResults(): CycleResult[] {
    const out = s.unreported;
    s.unreported = [];
    // The open cycle counts once its discharge has ended (a rest or charge has begun after it).
    if (s.open && s.open.hasDischarge && s.phase.kind !== DISCHARGE) out.push(toResult(s.open, false));
    return out;
  }

  return {
    push,
    takeResults,
    peekOpenCycle: () => (s.open ? toResult(s.open, false) : null),
    get samples() {
      return s.samples;
    },
    get lastTimeS() {
      const p = s.pending.t;
      return p.length > 0 ? (p[p.length - 1] as number) : s.last ? s.last.t : null;
    },
    saveState: () => structuredClone(s),
  };
}

/** sum[k] += x with Neumaier's compensation kept in sum[k + 1]. */
function addCompensated(sum: number[], k: number, x: number): void {
  const total = sum[k] as number;
  const next = total + x;
  sum[k + 1] = (sum[k + 1] as number) + (Math.abs(total) >= Math.abs(x) ? total - next + x : x - next + total);
  sum[k] = next;
}

function toResult(c: CycleSums, closed: boolean): CycleResult {
  // Halve for the trapezoid, then A·s → Ah and W·s → Wh.
  const chargeAh = ((c.q[0] as number) + (c.q[1] as number)) / 7200;
  const dischargeAh = ((c.q[2] as number) + (c.q[3] as number)) / 7200;
  const chargeWh = ((c.e[0] as number) + (c.e[1] as number)) / 7200;
  const dischargeWh = ((c.e[2] as number) + (c.e[3] as number)) / 7200;
  return {
    cycle: c.cycle,
    chargeAh,
    dischargeAh,
    chargeWh,
    dischargeWh,
    coulombicEfficiency: chargeAh > 0 ? dischargeAh / chargeAh : null,
    energyEfficiency: chargeWh > 0 ? dischargeWh / chargeWh : null,
    endOfChargeV: c.endOfChargeV,
    endOfDischargeV: c.endOfDischargeV,
    dcResistanceOhm: c.dcResistanceOhm,
    firstTimeS: c.firstTimeS,
    lastTimeS: c.lastTimeS,
    closed,
  };
}
