import "server-only";
import { getDb } from "@/db";
import { getCellSpecification, type CellSpecificationView } from "@/db/cell-specifications";
import type { DischargeResultRow } from "@/db/discharge-results";
import { listDischargeResults } from "./list-discharge-results";
import { getLot, type LotView } from "@/db/lots";
import { getSpecimen, type SpecimenView } from "@/db/specimens";
import type { AnalysisResult } from "@/lib/analysis/analysis-result";
import type { DatasheetComparison } from "@/lib/analysis/datasheet-comparison";
import type { RateCapabilityTable } from "@/lib/analysis/rate-capability";
import { DomainError } from "@/lib/errors";
import { summariseDatasheetComparison, summariseRateCapability, summariseStatistics, type StatisticsSummary } from "./summarise-results";

export interface LotResults {
  lot: LotView;
  specification: CellSpecificationView;
  results: DischargeResultRow[];
  statistics: StatisticsSummary;
  rateCapability: AnalysisResult<RateCapabilityTable>;
}

async function requireSpecification(id: string): Promise<CellSpecificationView> {
  const spec = await getCellSpecification(getDb(), id);
  if (!spec) throw new DomainError("not-found", "No such cell specification.");
  return spec;
}

/** A lot's reviewed discharge results with their statistics per current and the lot's rate table. */
export async function readLotResults(lotId: string): Promise<LotResults> {
  const lot = await getLot(getDb(), lotId);
  if (!lot) throw new DomainError("not-found", "No such lot.");
  const [specification, results] = await Promise.all([requireSpecification(lot.specification.id), listDischargeResults(getDb(), { lotId })]);
  return {
    lot,
    specification,
    results,
    statistics: summariseStatistics(results, specification.data),
    rateCapability: summariseRateCapability(results, specification.data),
  };
}

export interface SpecificationResults {
  specification: CellSpecificationView;
  results: DischargeResultRow[];
  statistics: StatisticsSummary;
  comparison: AnalysisResult<DatasheetComparison>;
}

/**
 * Every reviewed discharge result of a cell specification, across lots and loose specimens, with the
 * statistics per current and each datasheet claim beside the measurements. The step records have no
 * mass field yet, so the mass line reads "not measured".
 */
export async function readSpecificationResults(specificationId: string): Promise<SpecificationResults> {
  const [specification, results] = await Promise.all([
    requireSpecification(specificationId),
    listDischargeResults(getDb(), { cellSpecificationId: specificationId }),
  ]);
  return {
    specification,
    results,
    statistics: summariseStatistics(results, specification.data),
    comparison: summariseDatasheetComparison(results, specification.data),
  };
}

export interface SpecimenResults {
  specimen: SpecimenView;
  specification: CellSpecificationView;
  results: DischargeResultRow[];
  rateCapability: AnalysisResult<RateCapabilityTable>;
}

/** One specimen's reviewed discharges as a rate-capability table. */
export async function readSpecimenResults(specimenId: string): Promise<SpecimenResults> {
  const specimen = await getSpecimen(getDb(), specimenId);
  if (!specimen) throw new DomainError("not-found", "No such specimen.");
  const [specification, results] = await Promise.all([requireSpecification(specimen.specification.id), listDischargeResults(getDb(), { specimenId })]);
  return { specimen, specification, results, rateCapability: summariseRateCapability(results, specification.data) };
}
