import "server-only";
import type { Executor } from "@/db";
import { listRunReviewRecords, type RunReviewRecord } from "@/db/reviews";
import { parseStoredEvaluation } from "@/lib/conformance/stored-evaluation";

/** A reviewer's note on one deviating finding, with the finding's title from the evaluation reviewed. */
export interface AcknowledgedDeviation {
  findingId: string;
  note: string;
  /** The finding's step and check ("Rest after charge: Ambient temperature within its range"), or null if unknown. */
  findingTitle: string | null;
}

export type RunReviewView = Omit<RunReviewRecord, "deviationNotes" | "evaluationForNotes"> & {
  acknowledgedDeviations: AcknowledgedDeviation[];
};

/** "Step label: check" by finding id, from a stored evaluation: how a note names the finding it answers. */
export function titleFindings(stored: unknown): Map<string, string> {
  if (stored === null || stored === undefined) return new Map();
  const e = parseStoredEvaluation(stored);
  const titles = new Map<string, string>(e.runFindings.map((f) => [f.id, `The run as a whole: ${f.title}`]));
  for (const step of e.steps) {
    for (const f of step.findings) titles.set(f.id, `${step.label}${step.cycle > 1 ? ` (cycle ${step.cycle})` : ""}: ${f.title}`);
  }
  return titles;
}

function toView({ deviationNotes, evaluationForNotes, ...review }: RunReviewRecord): RunReviewView {
  const titles = titleFindings(evaluationForNotes);
  return { ...review, acknowledgedDeviations: deviationNotes.map((n) => ({ ...n, findingTitle: titles.get(n.findingId) ?? null })) };
}

/** Every review of a run, oldest first: returns with their comments, the acceptance with its signature. */
export async function listRunReviews(db: Executor, runId: string): Promise<RunReviewView[]> {
  return (await listRunReviewRecords(db, runId)).map(toView);
}

/** The run's latest review, or null: what the step sheet shows a returned run's operator. */
export async function getLatestRunReview(db: Executor, runId: string): Promise<RunReviewView | null> {
  return (await listRunReviews(db, runId)).at(-1) ?? null;
}
