import "server-only";
import type { Executor } from "@/db";
import { getLotSamplingRecord, type LotSamplingRecord } from "@/db/lot-sampling";
import { decideLot, type LotDecision } from "./decide-lot";

export type { LotMemberResult, LotSampleDrawView, LotSampleMember } from "@/db/lot-sampling";

export interface LotSampling extends LotSamplingRecord {
  /** decideLot's answer from the counts; null while the lot has no plan. */
  decision: LotDecision | null;
}

/** A lot's sampling: its plan, the drawn sample with each cell's result, the counts and the lot decision. */
export async function getLotSampling(db: Executor, lotId: string): Promise<LotSampling | null> {
  const record = await getLotSamplingRecord(db, lotId);
  if (!record) return null;
  return { ...record, decision: decideFromCounts(lotId, record) };
}

function decideFromCounts(lotId: string, record: LotSamplingRecord): LotDecision | null {
  if (!record.plan) return null;
  const decided = decideLot({ plan: record.plan, tested: record.counts.tested, nonconforming: record.counts.nonconforming });
  // The counts come from at most n drawn positions, so decideLot cannot refuse them.
  if (!decided.ok) throw new Error(`lot ${lotId}: ${decided.error.message}`);
  return decided.decision;
}
