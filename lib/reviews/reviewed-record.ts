import { hashCanonicalJson } from "@/lib/certificates/canonical-json";
import { listFindings, type Finding, type RunEvaluation } from "@/lib/conformance";

/**
 * The content a reviewer's signature is linked to (21 CFR 11.70): the run, the evaluation looked at,
 * its findings and its verdict. Its SHA-256 is stored with the signature, so the signature cannot be
 * moved to another run or to a later evaluation of the same run.
 */
export function hashReviewedRecord(input: { runId: string; evaluationId: string; evaluation: RunEvaluation }): string {
  const content = { runId: input.runId, evaluationId: input.evaluationId, findings: listFindings(input.evaluation), verdict: input.evaluation.verdict };
  return hashCanonicalJson(content);
}

/** The findings a reviewer must write a note on before accepting. */
export function listDeviatingFindings(evaluation: RunEvaluation): Finding[] {
  return listFindings(evaluation).filter((f) => f.outcome === "deviates");
}

export interface Acknowledgement {
  findingId: string;
  note: string;
}

/**
 * Pairs each deviating finding with the reviewer's note on it. Refuses, in words, a deviation left
 * without a note and a note on a finding that does not deviate in this evaluation (a form from an
 * earlier evaluation); the notes come back in the order of the findings.
 */
export function matchAcknowledgements(
  deviating: readonly Finding[],
  acknowledgements: readonly Acknowledgement[],
  describe: (f: Finding) => string,
): { ok: true; acknowledged: Acknowledgement[] } | { ok: false; message: string } {
  const notes = new Map<string, string>();
  for (const a of acknowledgements) {
    if (notes.has(a.findingId)) return { ok: false, message: `Two notes were sent for the same finding (${a.findingId}); send one.` };
    notes.set(a.findingId, a.note.trim());
  }
  const known = new Set(deviating.map((f) => f.id));
  const stray = [...notes.keys()].filter((id) => !known.has(id));
  if (stray.length > 0) {
    return { ok: false, message: `A note names a finding that does not deviate in the evaluation under review (${stray.join(", ")}). Reload the page and read the findings again.` };
  }
  const missing = deviating.filter((f) => !notes.get(f.id));
  if (missing.length > 0) {
    return {
      ok: false,
      message: `Write a note on every deviating finding before accepting; still without a note: ${missing.map(describe).join("; ")}.`,
    };
  }
  return { ok: true, acknowledged: deviating.map((f) => ({ findingId: f.id, note: notes.get(f.id)! })) };
}
