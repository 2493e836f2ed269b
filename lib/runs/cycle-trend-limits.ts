import type { StopCriterion } from "@/lib/analysis";
import type { ProcedureResolution } from "@/protocols";
import { readEnduranceLimits } from "@/protocols/endurance";

/** What the retention trend is drawn against: rated capacity, and the stop criterion when the procedure has one. */
export interface CycleTrendLimits {
  ratedCapacityMAh: number;
  stop: StopCriterion | null;
  /** Acceptance: retention after the last cycle at least this share of rated (null when the procedure states none). */
  acceptAtLeastPercentOfRated: number | null;
}

/**
 * The run's trend limits: its procedure's endurance limits when it has a cycle block (protocols/endurance.ts,
 * the values frozen with the resolution), otherwise the cell's rated capacity alone (no stop line, no estimate).
 */
export function readCycleTrendLimits(resolution: ProcedureResolution, specRatedCapacityMAh: number | null): CycleTrendLimits | null {
  const endurance = readEnduranceLimits(resolution);
  if (endurance && endurance.ratedCapacityMAh > 0) {
    return {
      ratedCapacityMAh: endurance.ratedCapacityMAh,
      stop: { stopBelowPercentOfRated: endurance.stopBelowPercentOfRated, checkEveryCycles: endurance.checkEveryCycles, maxCycles: endurance.maxCycles },
      acceptAtLeastPercentOfRated: endurance.acceptAtLeastPercentOfRated,
    };
  }
  if (specRatedCapacityMAh === null || !(specRatedCapacityMAh > 0)) return null;
  return { ratedCapacityMAh: specRatedCapacityMAh, stop: null, acceptAtLeastPercentOfRated: null };
}
