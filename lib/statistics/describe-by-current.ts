import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";
import { describeResults, type ResultsDescription } from "./describe-results";
import { defaultCurrentTolerance, findReferenceGroup, groupByCurrent } from "./group-by-current";

/** One discharge result as the statistics need it. */
export interface DischargeFigures {
  currentA: number;
  capacityAh: number;
  energyWh: number;
}

export interface DescribeByCurrentInput {
  results: readonly DischargeFigures[];
  ratedCapacityMah: number;
  minimumCapacityMah?: number;
  /** The datasheet energy, or rated capacity × nominal voltage when the datasheet gives none. */
  ratedEnergyWh?: number;
  relativeTolerance?: number;
}

export interface CurrentStatistics {
  currentA: number;
  multipleOfIt: number;
  count: number;
  /** True for the group at 0.2 It, where rated and minimum capacity are defined. */
  isReferenceCurrent: boolean;
  /** Capacity in mAh, against the rated and minimum capacity. */
  capacity: AnalysisResult<ResultsDescription>;
  /** Energy in Wh, against the rated energy. */
  energy: AnalysisResult<ResultsDescription>;
  /** Why the rated figures are shown away from 0.2 It; null at 0.2 It. */
  note: string | null;
}

/**
 * Capacity and energy statistics at each test current of a lot or a cell specification. Rated and
 * minimum capacity belong to the 0.2 It discharge (IEC 61960-3); at other currents the comparison
 * is shown for information, and says so.
 */
export function describeByCurrent(input: DescribeByCurrentInput): AnalysisResult<CurrentStatistics[]> {
  const { results, ratedCapacityMah, minimumCapacityMah, ratedEnergyWh, relativeTolerance = defaultCurrentTolerance } = input;
  if (results.length === 0) return fail("invalid-input", "There are no discharge results to describe.");
  const grouped = groupByCurrent({ results, ratedCapacityMah, relativeTolerance });
  if (!grouped.ok) return grouped;
  const reference = findReferenceGroup(grouped.value, ratedCapacityMah, relativeTolerance);
  return succeed(
    grouped.value.map((group) => {
      const isReferenceCurrent = group === reference;
      return {
        currentA: group.currentA,
        multipleOfIt: group.multipleOfIt,
        count: group.members.length,
        isReferenceCurrent,
        capacity: describeResults({
          values: group.members.map((r) => r.capacityAh * 1000),
          unit: "mAh",
          rated: ratedCapacityMah,
          minimum: minimumCapacityMah,
        }),
        energy: describeResults({ values: group.members.map((r) => r.energyWh), unit: "Wh", rated: ratedEnergyWh }),
        note: isReferenceCurrent ? null : "Rated and minimum capacity are defined at 0.2 It; at this current they are shown for comparison only.",
      };
    }),
  );
}
