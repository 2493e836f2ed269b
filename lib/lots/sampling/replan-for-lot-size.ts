import "server-only";
import type { Executor } from "@/db";
import { getLotPlanColumns, hasLotSampleDraw, updateLotComputedPlan } from "@/db/lots";
import { DomainError } from "@/lib/errors";
import { computeSamplingPlan } from "./compute-sampling-plan";

/**
 * A lot's quantity is its sampling plan's lot size. Before the draw, a new quantity recomputes the
 * plan (same level and AQL); after it, the quantity is fixed, since the drawn positions are positions
 * of that lot. Call inside the transaction that changes the quantity, with the lot locked. Returns
 * the change in words for that transaction's audit event, or null when the plan did not change.
 */
export async function replanForNewLotSize(
  tx: Executor,
  lot: { id: string; identifier: string; quantityReceived: number },
  newQuantity: number,
): Promise<{ before: string; after: string } | null> {
  if (newQuantity === lot.quantityReceived) return null;
  if (await hasLotSampleDraw(tx, lot.id)) {
    throw new DomainError("conflict", `The sample of lot ${lot.identifier} is drawn from its ${lot.quantityReceived} cells: the quantity received cannot change now.`);
  }
  const stored = await getLotPlanColumns(tx, lot.id);
  if (!stored) return null;
  const plan = computeSamplingPlan({ lotSize: newQuantity, inspectionLevel: stored.inspectionLevel, aql: stored.aql });
  await updateLotComputedPlan(tx, lot.id, plan);
  const words = (p: typeof plan) => `lot of ${p.lotSize}: code letter ${p.codeLetter}, n = ${p.sampleSize}, Ac ${p.acceptanceNumber}, Re ${p.rejectionNumber}`;
  return { before: words(stored.plan), after: words(plan) };
}
