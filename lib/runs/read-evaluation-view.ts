import "server-only";
import { getDb } from "@/db";
import { getRunEvaluationRecord } from "@/db/certificates";
import { createEvaluationViewCache } from "./evaluation-view-cache";

const globalForViews = globalThis as unknown as { cellwrightEvaluationViews?: ReturnType<typeof createEvaluationViewCache> };

/** The results page's view of one stored evaluation, read from the database once per process (evaluation-view-cache.ts). */
export function readEvaluationView(evaluationId: string) {
  globalForViews.cellwrightEvaluationViews ??= createEvaluationViewCache((id) => getRunEvaluationRecord(getDb(), id));
  return globalForViews.cellwrightEvaluationViews.read(evaluationId);
}
