import type { Finding, RunEvaluation } from "@/lib/conformance";

/** The reviewer's note on one deviating finding, as run_review.acknowledged_deviations holds it. */
export interface AcknowledgedDeviation {
  findingId: string;
  note: string;
}

/** Reads run_review.acknowledged_deviations; anything not shaped like a note counts as no note. */
export function readAcknowledgedDeviations(value: unknown): AcknowledgedDeviation[] {
  if (!Array.isArray(value)) return [];
  return value.flatMap((entry: unknown) => {
    if (typeof entry !== "object" || entry === null) return [];
    const { findingId, note } = entry as { findingId?: unknown; note?: unknown };
    return typeof findingId === "string" && typeof note === "string" ? [{ findingId, note }] : [];
  });
}

/**
 * The deviating findings of an evaluation that the reviewer did not acknowledge with a note. A
 * certificate states every deviation from the method (ISO/IEC 17025:2017 7.8.2.1 n) and the review
 * before release covers them (7.8.1), so one left without a note stops the certificate.
 */
export function findUnacknowledgedDeviations(evaluation: EvaluationFindings, acknowledged: readonly AcknowledgedDeviation[]): Finding[] {
  const noted = new Set(acknowledged.filter((entry) => entry.note.trim().length > 0).map((entry) => entry.findingId));
  return listEvaluationFindings(evaluation).filter((finding) => finding.outcome === "deviates" && !noted.has(finding.id));
}

/** The parts of an evaluation (stored in any version) that hold its findings. */
export type EvaluationFindings = Pick<RunEvaluation, "runFindings" | "steps">;

/** Every finding in reading order: the run's own checks, then each step's (as lib/conformance lists them). */
export function listEvaluationFindings(evaluation: EvaluationFindings): Finding[] {
  return [...evaluation.runFindings, ...evaluation.steps.flatMap((step) => step.findings)];
}
