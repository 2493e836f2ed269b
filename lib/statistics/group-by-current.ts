import { mean } from "simple-statistics";
import { roundSignificant } from "@/protocols/format-number";
import { fail, succeed, type AnalysisResult } from "@/lib/analysis/analysis-result";

/**
 * Two results belong to the same test current when they lie within 2 % of the group's lowest: two
 * readings each within the ±1 % current tolerance of IEC 61960-3 clause 4 of one set-point differ by
 * about 2 % at most.
 */
export const defaultCurrentTolerance = 0.02;

/** The reference discharge current of the rated-capacity test, 0.2 It (IEC 61960-3; It from IEC 61434). */
export const referenceMultipleOfIt = 0.2;

export interface CurrentGroup<T> {
  /** Mean of the members' currents, A. */
  currentA: number;
  /** currentA / It, with It = rated capacity in Ah / 1 h (IEC 61434). */
  multipleOfIt: number;
  lowestA: number;
  highestA: number;
  members: T[];
}

export interface GroupByCurrentInput<T> {
  results: readonly T[];
  ratedCapacityMah: number;
  /** Relative width of a group, a fraction; 0.02 when left out. */
  relativeTolerance?: number;
}

/** It in A for a rated capacity in mAh: Cn / 1 h (IEC 61434). */
export function computeItA(ratedCapacityMah: number): number {
  return ratedCapacityMah / 1000;
}

/**
 * Groups results by test current, lowest current first: a result joins the current group while it
 * is within the tolerance of the group's lowest current, and starts a new group otherwise.
 */
export function groupByCurrent<T extends { currentA: number }>(input: GroupByCurrentInput<T>): AnalysisResult<CurrentGroup<T>[]> {
  const { results, ratedCapacityMah, relativeTolerance = defaultCurrentTolerance } = input;
  if (!(Number.isFinite(ratedCapacityMah) && ratedCapacityMah > 0)) return fail("invalid-input", "The rated capacity must be greater than 0 mAh.");
  if (!(Number.isFinite(relativeTolerance) && relativeTolerance >= 0 && relativeTolerance < 0.5)) {
    return fail("invalid-input", "The current tolerance must be a fraction from 0 to below 0.5.");
  }
  if (!results.every((r) => Number.isFinite(r.currentA) && r.currentA > 0)) {
    return fail("invalid-input", "Every discharge current must be a positive number of amperes (give its magnitude).");
  }
  const itA = computeItA(ratedCapacityMah);
  const sorted = [...results].sort((a, b) => a.currentA - b.currentA);
  const groups: T[][] = [];
  for (const result of sorted) {
    const current = groups.at(-1);
    const lowest = current?.[0]?.currentA;
    if (current && lowest !== undefined && result.currentA - lowest <= relativeTolerance * lowest) current.push(result);
    else groups.push([result]);
  }
  return succeed(
    groups.map((members) => {
      const currentA = mean(members.map((m) => m.currentA));
      return {
        currentA,
        // 12 significant digits: 0.6 A / 3 A reads 0.2 It, not 0.19999999999999998.
        multipleOfIt: roundSignificant(currentA / itA),
        lowestA: members[0]?.currentA as number,
        highestA: members.at(-1)?.currentA as number,
        members,
      };
    }),
  );
}

/** The group at 0.2 It: the nearest one whose current is within the tolerance of 0.2 It, or null. */
export function findReferenceGroup<T>(
  groups: readonly CurrentGroup<T>[],
  ratedCapacityMah: number,
  relativeTolerance: number = defaultCurrentTolerance,
): CurrentGroup<T> | null {
  const target = referenceMultipleOfIt * computeItA(ratedCapacityMah);
  let best: CurrentGroup<T> | null = null;
  for (const group of groups) {
    const distance = Math.abs(group.currentA - target);
    if (distance <= relativeTolerance * target && (best === null || distance < Math.abs(best.currentA - target))) best = group;
  }
  return best;
}
