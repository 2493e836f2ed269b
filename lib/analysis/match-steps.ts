import { fail, succeed, type AnalysisResult } from "./analysis-result";
import type { PhaseKind } from "./segment";

export type ExpectedStepKind = "charge" | "discharge" | "rest" | "pulse" | "soak" | "measure" | "observe";

/** One step the procedure expects, in order. Kept minimal so any procedure type maps onto it. */
export interface ExpectedStep {
  id: string;
  kind: ExpectedStepKind;
  /** A step the log may lack without a finding: a cycle of an endurance block the run has not reached. */
  optional?: boolean;
}

/** What matching needs to know of a phase; a segmented Phase fits. */
export interface MatchablePhase {
  kind: PhaseKind;
  pulse?: unknown;
}

export interface StepMatch {
  stepId: string;
  kind: ExpectedStepKind;
  /** Index into the phase list, or null when no phase was matched. */
  phaseIndex: number | null;
  /** Soak, measure and observe steps may leave no trace in the current, so they are not required. */
  required: boolean;
}

export interface StepMatching {
  steps: StepMatch[];
  /** Required steps with no phase. */
  unmatchedStepIds: string[];
  /** Phases that no step claimed, by index. */
  extraPhaseIndexes: number[];
}

/** Above this many cells the alignment table would take too much memory for one request. */
const maxTableCells = 50_000_000;

/**
 * How well a phase stands for an expected step: 0 = cannot, higher = better. Current-carrying
 * matches weigh most, since a charge or discharge is stronger evidence than a pause; so when two
 * alignments match as many steps, the one that accounts for the active phases wins. A pulse is
 * best a charge or discharge phase with two current levels; a single-level one is accepted weakly,
 * since a pulse from rest has the rest as its base. A discharge may also be a stepped one. Soak and
 * measure take a rest only when no rest step wants it more.
 */
function scoreMatch(step: ExpectedStepKind, phase: MatchablePhase): number {
  const hasPulse = phase.pulse !== null && phase.pulse !== undefined;
  switch (step) {
    case "charge":
      return phase.kind === "charge" ? 3 : 0;
    case "discharge":
      return phase.kind === "discharge" ? (hasPulse ? 2 : 3) : 0;
    case "pulse":
      return phase.kind === "rest" ? 0 : hasPulse ? 3 : 1;
    case "rest":
      return phase.kind === "rest" ? 2 : 0;
    case "soak":
    case "measure":
    case "observe":
      return phase.kind === "rest" ? 1 : 0;
    default: {
      const unknown: never = step;
      throw new Error(`Unknown step kind ${String(unknown)}`);
    }
  }
}

/**
 * Matches phases to the expected steps in order: the alignment (as in sequence alignment, by
 * dynamic programming) that matches the most steps and, among those, has the best match quality;
 * each phase is used at most once and the order is kept on both sides. Steps left over are
 * unmatched; phases left over are extra.
 */
export function matchSteps(expected: readonly ExpectedStep[], phases: readonly MatchablePhase[]): AnalysisResult<StepMatching> {
  const m = expected.length;
  const n = phases.length;
  if ((m + 1) * (n + 1) > maxTableCells) {
    return fail("invalid-input", `Matching ${m} steps to ${n} phases is too large; match one cycle at a time.`);
  }
  // Matching more steps comes first, then match quality, with a point less for an optional step so that a
  // required step takes a phase an optional one could also take: each match is worth more than any sum of
  // those points (at most 4 a match).
  const perMatch = 5 * (Math.min(m, n) + 1);
  const valueOf = (quality: number, step: ExpectedStep) => (quality > 0 ? perMatch + quality - (step.optional === true ? 1 : 0) : 0);
  const width = n + 1;
  const best = new Int32Array((m + 1) * width);
  for (let i = 1; i <= m; i++) {
    const step = expected[i - 1] as ExpectedStep;
    for (let j = 1; j <= n; j++) {
      const score = valueOf(scoreMatch(step.kind, phases[j - 1] as MatchablePhase), step);
      const skipStep = best[(i - 1) * width + j] as number;
      const skipPhase = best[i * width + j - 1] as number;
      const take = score > 0 ? (best[(i - 1) * width + j - 1] as number) + score : -1;
      best[i * width + j] = Math.max(take, skipStep, skipPhase);
    }
  }

  const phaseOfStep: (number | null)[] = new Array<number | null>(m).fill(null);
  const used = new Uint8Array(n);
  let i = m;
  let j = n;
  while (i > 0 && j > 0) {
    const here = best[i * width + j] as number;
    const step = expected[i - 1] as ExpectedStep;
    const score = valueOf(scoreMatch(step.kind, phases[j - 1] as MatchablePhase), step);
    if (score > 0 && here === (best[(i - 1) * width + j - 1] as number) + score) {
      phaseOfStep[i - 1] = j - 1;
      used[j - 1] = 1;
      i--;
      j--;
    } else if (here === best[(i - 1) * width + j]) {
      i--;
    } else {
      j--;
    }
  }

  const steps = expected.map((step, k) => ({
    stepId: step.id,
    kind: step.kind,
    phaseIndex: phaseOfStep[k] ?? null,
    required: step.optional !== true && step.kind !== "soak" && step.kind !== "measure" && step.kind !== "observe",
  }));
  const extraPhaseIndexes: number[] = [];
  used.forEach((isUsed, k) => {
    if (!isUsed) extraPhaseIndexes.push(k);
  });
  return succeed({
    steps,
    unmatchedStepIds: steps.filter((s) => s.required && s.phaseIndex === null).map((s) => s.stepId),
    extraPhaseIndexes,
  });
}
