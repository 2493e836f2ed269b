import "server-only";
import { getDb } from "@/db";
import { getLatestRunEvaluation } from "@/db/run-series";
import { getRun } from "@/db/runs";
import { DomainError } from "@/lib/errors";

/** The run and its latest evaluation, for the exports; 404 when it has none yet. */
export async function readRunResults(runId: string) {
  const [run, stored] = await Promise.all([getRun(getDb(), runId), getLatestRunEvaluation(getDb(), runId)]);
  if (!run) throw new DomainError("not-found", "No such run.");
  if (!stored) throw new DomainError("not-found", `Run ${run.number} has not been evaluated yet.`);
  // Written only by evaluateStoredRun.
  return { run, stored, evaluation: stored.evaluation };
}
