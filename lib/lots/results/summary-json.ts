import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import type { RateCapabilityTable } from "@/lib/analysis/rate-capability";
import { cplFormula, cplSource } from "@/lib/statistics";
import type { StatisticsSummary } from "./summarise-results";

/** A computation's value, or `{ problem }` with its message where it could not be made (fewer than two results, none at all). */
export function toValueOrProblem<T>(result: AnalysisResult<T>): T | { problem: string } {
  return result.ok ? result.value : { problem: result.error.message };
}

/** Statistics per current and the rate table as the summary APIs and the JSON export state them. */
export function toSummaryJson(input: { statistics: StatisticsSummary; rateCapability?: AnalysisResult<RateCapabilityTable> }) {
  const { statistics, rateCapability } = input;
  return {
    basis: {
      results: "Reviewed runs only (accepted or certified), with the evaluation the accepting reviewer signed for; capacity discharges at 20 °C after a charge (no preconditions, no discharges after storage or a cold soak).",
      capability: `${cplFormula}, LSL = minimum capacity (${cplSource}).`,
      ratedEnergy: `${statistics.ratedEnergyWh} Wh: ${statistics.ratedEnergyBasis}.`,
    },
    statistics: {
      resultCount: statistics.resultCount,
      specimenCount: statistics.specimenCount,
      ratedCapacityMah: statistics.ratedCapacityMah,
      minimumCapacityMah: statistics.minimumCapacityMah,
      ratedEnergyWh: statistics.ratedEnergyWh,
      problem: statistics.problem,
      currents: statistics.currents.map((c) => ({
        currentA: c.currentA,
        multipleOfIt: c.multipleOfIt,
        count: c.count,
        specimenCount: c.specimenCount,
        isReferenceCurrent: c.isReferenceCurrent,
        aboveRating: c.aboveRating,
        note: c.note,
        capacityMah: toValueOrProblem(c.capacity),
        energyWh: toValueOrProblem(c.energy),
        capacityHistogram: toValueOrProblem(c.capacityHistogram),
        energyHistogram: toValueOrProblem(c.energyHistogram),
      })),
    },
    ...(rateCapability && { rateCapability: toValueOrProblem(rateCapability) }),
  };
}
