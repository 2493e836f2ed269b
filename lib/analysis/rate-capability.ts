import { mean } from "simple-statistics";
import { defaultCurrentTolerance, findReferenceGroup, groupByCurrent, referenceMultipleOfIt, type CurrentGroup } from "@/lib/statistics/group-by-current";
import { roundSignificant } from "@/protocols/format-number";
import { fail, succeed, type AnalysisResult } from "./analysis-result";

/** One completed discharge of one specimen. */
export interface DischargeResult {
  /** Discharge current (magnitude), A. */
  currentA: number;
  capacityAh: number;
  energyWh: number;
  meanVoltageV: number;
  /** The run acknowledged a current beyond the cell's rating for this discharge. */
  beyondRating?: boolean;
  specimenId?: string;
}

export interface RateCapabilityRating {
  ratedCapacityMah: number;
  maxContinuousDischargeCurrentA: number;
}

export interface RateCapabilityInput {
  /** One specimen's results, or a lot's: results at the same current are averaged. */
  results: readonly DischargeResult[];
  rating: RateCapabilityRating;
  relativeTolerance?: number;
}

export interface RateCapabilityRow {
  /** Mean current of the group, A. */
  currentA: number;
  multipleOfIt: number;
  /** Results averaged in this row. */
  count: number;
  capacityAh: number;
  capacityMAh: number;
  energyWh: number;
  /** Mean of the results' mean voltages, V. */
  meanVoltageV: number;
  /** Capacity as % of the 0.2 It result; null without a 0.2 It result. */
  capacityPercentOfReference: number | null;
  energyPercentOfReference: number | null;
  capacityPercentOfRated: number;
  isReference: boolean;
  aboveRating: boolean;
  /** Why the row is marked above the rating; null when it is not. */
  aboveRatingReason: string | null;
}

export interface RateCapabilityTable {
  itA: number;
  rows: RateCapabilityRow[];
  /** The row at 0.2 It, or null. */
  reference: RateCapabilityRow | null;
  /** "no 0.2 It result" when there is none; null otherwise. */
  referenceNote: string | null;
  basis: string[];
}

/** The ±1 % current tolerance of IEC 61960-3 clause 4 (docs/references.md §3): a measured current only counts as above the rating beyond it. */
const currentReadingTolerance = 0.01;

function checkInput({ results, rating }: RateCapabilityInput): string | null {
  if (results.length === 0) return "There are no discharge results for a rate-capability table.";
  if (!(rating.ratedCapacityMah > 0) || !(rating.maxContinuousDischargeCurrentA > 0)) {
    return "The cell rating needs a rated capacity and a maximum continuous discharge current greater than 0.";
  }
  for (const r of results) {
    if (![r.capacityAh, r.energyWh].every((x) => Number.isFinite(x) && x >= 0)) return "Capacity and energy must be numbers of 0 or more.";
    if (!(Number.isFinite(r.meanVoltageV) && r.meanVoltageV > 0)) return "Every mean voltage must be a positive number of volts.";
  }
  return null;
}

function describeAboveRating(group: CurrentGroup<DischargeResult>, maxA: number): string | null {
  const flagged = group.members.filter((m) => m.beyondRating === true).length;
  if (flagged > 0) return `${flagged} of ${group.members.length} result${group.members.length === 1 ? "" : "s"} flagged on the run as beyond the cell's rating`;
  if (group.highestA > maxA * (1 + currentReadingTolerance)) {
    return `measured ${group.highestA.toFixed(2)} A is above the maximum continuous discharge current of ${maxA} A (by more than the ±1 % current tolerance)`;
  }
  return null;
}

function computePercent(value: number, reference: number | undefined): number | null {
  return reference === undefined || reference === 0 ? null : roundSignificant((value * 100) / reference);
}

function summariseGroup(group: CurrentGroup<DischargeResult>, rating: RateCapabilityRating) {
  const capacityAh = mean(group.members.map((m) => m.capacityAh));
  const aboveRatingReason = describeAboveRating(group, rating.maxContinuousDischargeCurrentA);
  return {
    currentA: group.currentA,
    multipleOfIt: group.multipleOfIt,
    count: group.members.length,
    capacityAh,
    capacityMAh: roundSignificant(capacityAh * 1000),
    energyWh: mean(group.members.map((m) => m.energyWh)),
    meanVoltageV: mean(group.members.map((m) => m.meanVoltageV)),
    capacityPercentOfRated: roundSignificant((capacityAh * 1000 * 100) / rating.ratedCapacityMah),
    aboveRating: aboveRatingReason !== null,
    aboveRatingReason,
  };
}

/**
 * Capacity and energy at each discharge current, in A and as a multiple of It, as % of the 0.2 It
 * result and of the rated capacity, with the mean voltage; rows above the cell's maximum continuous
 * discharge current are marked.
 */
export function computeRateCapability(input: RateCapabilityInput): AnalysisResult<RateCapabilityTable> {
  const problem = checkInput(input);
  if (problem) return fail("invalid-input", problem);
  const { results, rating, relativeTolerance = defaultCurrentTolerance } = input;
  const grouped = groupByCurrent({ results, ratedCapacityMah: rating.ratedCapacityMah, relativeTolerance });
  if (!grouped.ok) return grouped;
  const referenceGroup = findReferenceGroup(grouped.value, rating.ratedCapacityMah, relativeTolerance);
  const referenceSummary = referenceGroup ? summariseGroup(referenceGroup, rating) : null;
  const rows: RateCapabilityRow[] = grouped.value.map((group) => {
    const summary = summariseGroup(group, rating);
    return {
      ...summary,
      capacityPercentOfReference: computePercent(summary.capacityAh, referenceSummary?.capacityAh),
      energyPercentOfReference: computePercent(summary.energyWh, referenceSummary?.energyWh),
      isReference: group === referenceGroup,
    };
  });
  const percent = Math.round(relativeTolerance * 1000) / 10;
  return succeed({
    itA: roundSignificant(rating.ratedCapacityMah / 1000),
    rows,
    reference: rows.find((row) => row.isReference) ?? null,
    referenceNote: referenceGroup ? null : "no 0.2 It result",
    basis: [
      `It = rated capacity / 1 h = ${rating.ratedCapacityMah / 1000} A (IEC 61434).`,
      `Results within ${percent} % of each other in current are one row; a lot's results in a row are averaged.`,
      `The reference is the row within ${percent} % of ${referenceMultipleOfIt} It, the rated-capacity discharge of IEC 61960-3.`,
    ],
  });
}
