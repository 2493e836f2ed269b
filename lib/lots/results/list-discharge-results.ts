import "server-only";
import type { Executor } from "@/db";
import { listResolvedSteps, listReviewedDischarges, type DischargeResultFilter, type DischargeResultRow } from "@/db/discharge-results";
import { classifyDischarge } from "./capacity-discharge";

/**
 * Every capacity discharge of the reviewed runs that match the filter: the discharges the reviewer
 * signed for, kept only where classifyDischarge says the step is a capacity result (measured, at
 * 20 °C, fresh from the charge). Ordered as db/discharge-results.ts reads them.
 */
export async function listDischargeResults(db: Executor, filter: DischargeResultFilter = {}): Promise<DischargeResultRow[]> {
  const discharges = await listReviewedDischarges(db, filter);
  if (discharges.length === 0) return [];
  const stepsOfRun = await listResolvedSteps(db, [...new Set(discharges.map((d) => d.runId))]);
  return discharges.filter((d) => classifyDischarge(stepsOfRun.get(d.runId) ?? [], d.stepId).counts);
}
