import type { RunEvaluation } from "./evaluate-run";
import type { Finding } from "./finding";

/** Every finding of an evaluation in reading order: the run's own checks, then each step's. */
export function listFindings(evaluation: RunEvaluation): Finding[] {
  return [...evaluation.runFindings, ...evaluation.steps.flatMap((step) => step.findings)];
}
