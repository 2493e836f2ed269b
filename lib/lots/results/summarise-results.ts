import { computeRateCapability, type RateCapabilityTable } from "@/lib/analysis/rate-capability";
import { compareWithDatasheet, type DatasheetComparison } from "@/lib/analysis/datasheet-comparison";
import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import {
  defaultCurrentTolerance,
  describeByCurrent,
  findReferenceGroup,
  groupByCurrent,
  histogram,
  type CurrentStatistics,
  type Histogram,
} from "@/lib/statistics";
import type { CellSpecification } from "@/protocols";
import { roundSignificant } from "@/protocols/format-number";

/** A discharge result with what the summaries need; DischargeResultRow (db/discharge-results.ts) fits. */
export interface SummaryResult {
  specimenId: string;
  runNumber: string;
  currentA: number;
  capacityAh: number;
  energyWh: number;
  meanVoltageV: number;
  beyondRating: boolean;
}

export interface CurrentSummary extends CurrentStatistics {
  specimenCount: number;
  /** The group's capacities, mAh, lowest first. */
  capacitiesMah: number[];
  /** Capacity in mAh; absent below one result. */
  capacityHistogram: AnalysisResult<Histogram>;
  energyHistogram: AnalysisResult<Histogram>;
  /** Any result of the group above the cell's rating (flagged on the run or measured above it). */
  aboveRating: boolean;
}

export interface StatisticsSummary {
  resultCount: number;
  specimenCount: number;
  ratedCapacityMah: number;
  minimumCapacityMah: number | null;
  /** Rated capacity × nominal voltage: the datasheet form has no energy field. */
  ratedEnergyWh: number;
  ratedEnergyBasis: string;
  currents: CurrentSummary[];
  /** Why there are no statistics at all (no results); null otherwise. */
  problem: string | null;
}

/** ±1 % current tolerance of IEC 61960-3 clause 4, as lib/analysis/rate-capability.ts applies it. */
const currentReadingTolerance = 0.01;

/** Whether one result was obtained above the cell's maximum continuous discharge current. */
export function isAboveRating(result: Pick<SummaryResult, "currentA" | "beyondRating">, maxContinuousDischargeCurrentA: number): boolean {
  return result.beyondRating || result.currentA > maxContinuousDischargeCurrentA * (1 + currentReadingTolerance);
}

/** Rated energy when the datasheet gives none: rated capacity × nominal voltage (IEC 61960-3 states energy this way). */
export function deriveRatedEnergyWh(cell: Pick<CellSpecification, "ratedCapacityMah" | "nominalVoltageV">): number {
  return roundSignificant((cell.ratedCapacityMah / 1000) * cell.nominalVoltageV);
}

/**
 * Capacity and energy statistics at each test current (count, mean, s, min, max, share at or above
 * rated, Cpl against the minimum capacity) with a histogram of each, by lib/statistics.
 */
export function summariseStatistics(results: readonly SummaryResult[], cell: CellSpecification): StatisticsSummary {
  const ratedEnergyWh = deriveRatedEnergyWh(cell);
  const head = {
    resultCount: results.length,
    specimenCount: new Set(results.map((r) => r.specimenId)).size,
    ratedCapacityMah: cell.ratedCapacityMah,
    minimumCapacityMah: cell.minimumCapacityMah ?? null,
    ratedEnergyWh,
    ratedEnergyBasis: `rated capacity × nominal voltage = ${cell.ratedCapacityMah} mAh × ${cell.nominalVoltageV} V`,
  };
  const described = describeByCurrent({
    results,
    ratedCapacityMah: cell.ratedCapacityMah,
    ...(cell.minimumCapacityMah !== undefined && { minimumCapacityMah: cell.minimumCapacityMah }),
    ratedEnergyWh,
  });
  if (!described.ok) return { ...head, currents: [], problem: described.error.message };
  const grouped = groupByCurrent({ results, ratedCapacityMah: cell.ratedCapacityMah });
  const groups = grouped.ok ? grouped.value : [];
  const currents = described.value.map((stats, k): CurrentSummary => {
    const members = groups[k]?.members ?? [];
    return {
      ...stats,
      specimenCount: new Set(members.map((m) => m.specimenId)).size,
      capacitiesMah: members.map((m) => m.capacityAh * 1000).sort((a, b) => a - b),
      capacityHistogram: histogram({ values: members.map((m) => m.capacityAh * 1000) }),
      energyHistogram: histogram({ values: members.map((m) => m.energyWh) }),
      aboveRating: members.some((m) => isAboveRating(m, cell.maxContinuousDischargeCurrentA)),
    };
  });
  return { ...head, currents, problem: null };
}

/** The rate-capability table of a specimen or a lot (lib/analysis/rate-capability.ts). */
export function summariseRateCapability(results: readonly SummaryResult[], cell: CellSpecification): AnalysisResult<RateCapabilityTable> {
  return computeRateCapability({
    results,
    rating: { ratedCapacityMah: cell.ratedCapacityMah, maxContinuousDischargeCurrentA: cell.maxContinuousDischargeCurrentA },
  });
}

/**
 * One 0.2 It result per specimen for the datasheet comparison (each claim holds for every cell): a
 * specimen tested more than once at 0.2 It answers with its latest run.
 */
export function pickReferenceResults<T extends SummaryResult>(results: readonly T[], cell: CellSpecification): T[] {
  const grouped = groupByCurrent({ results, ratedCapacityMah: cell.ratedCapacityMah });
  if (!grouped.ok) return [];
  const reference = findReferenceGroup(grouped.value, cell.ratedCapacityMah, defaultCurrentTolerance);
  const latest = new Map<string, T>();
  for (const r of reference?.members ?? []) {
    const kept = latest.get(r.specimenId);
    if (!kept || kept.runNumber < r.runNumber) latest.set(r.specimenId, r);
  }
  return [...latest.values()];
}

/** Each datasheet claim beside the measured distribution (lib/analysis/datasheet-comparison.ts). */
export function summariseDatasheetComparison(
  results: readonly SummaryResult[],
  cell: CellSpecification,
  massG: readonly number[] = [],
): AnalysisResult<DatasheetComparison> {
  const reference = pickReferenceResults(results, cell);
  return compareWithDatasheet({
    claims: {
      ratedCapacityMah: cell.ratedCapacityMah,
      ...(cell.minimumCapacityMah !== undefined && { minimumCapacityMah: cell.minimumCapacityMah }),
      nominalVoltageV: cell.nominalVoltageV,
      ...(cell.maxMassG !== undefined && { maxMassG: cell.maxMassG }),
      maxContinuousDischargeCurrentA: cell.maxContinuousDischargeCurrentA,
    },
    measured: {
      capacityMah: reference.map((r) => r.capacityAh * 1000),
      energyWh: reference.map((r) => r.energyWh),
      massG,
      dischargeCurrentsA: results.map((r) => r.currentA),
    },
  });
}
