import { LRUCache } from "lru-cache";
import type { RunEvaluation } from "@/lib/conformance";
import { parseStoredEvaluation } from "@/lib/conformance/stored-evaluation";
import type { StoredDecisionRule } from "@/protocols";
import { groupFindings, type FindingGroup } from "./group-findings";
import { listResultRows, type ResultRow } from "./list-result-rows";

/** What the results page shows of one stored evaluation, worked out once. */
export interface EvaluationView {
  evaluationId: string;
  runId: string;
  evaluation: RunEvaluation;
  /** Evaluations stored before the procedure's decision rule was recorded were judged by simple acceptance. */
  decisionRule: StoredDecisionRule;
  groups: FindingGroup[];
  resultRows: ResultRow[];
}

export interface StoredEvaluation {
  id: string;
  runId: string;
  /** A RunEvaluation as lib/conformance produced it. */
  evaluation: unknown;
}

export function buildEvaluationView(stored: StoredEvaluation): EvaluationView {
  // Older formats are upgraded where every stored evaluation is read (lib/conformance/stored-evaluation.ts).
  const evaluation = parseStoredEvaluation(stored.evaluation);
  return {
    evaluationId: stored.id,
    runId: stored.runId,
    evaluation,
    decisionRule: evaluation.statedDecisionRule,
    groups: groupFindings(evaluation),
    resultRows: listResultRows(evaluation),
  };
}

/**
 * Views of stored evaluations by id, least recently used dropped first. Never invalidated, and it needs not
 * be: the app's database role may only insert and read run_evaluation rows (migration 0007), so a stored
 * evaluation never changes; a new evaluation is a new row with a new id. Each process keeps its own.
 * Concurrent first reads of one id share one database read.
 */
export function createEvaluationViewCache(load: (evaluationId: string) => Promise<StoredEvaluation | null>, max = 64) {
  const cache = new LRUCache<string, EvaluationView>({
    max,
    fetchMethod: async (id) => {
      const stored = await load(id);
      return stored ? buildEvaluationView(stored) : undefined;
    },
  });
  return {
    read: async (evaluationId: string): Promise<EvaluationView | null> => (await cache.fetch(evaluationId)) ?? null,
    get size() {
      return cache.size;
    },
  };
}
