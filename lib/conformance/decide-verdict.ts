import type { ConformityOutcome } from "./decision-rule";
import type { Finding } from "./finding";

/** The statement of conformity for one criterion, on the cycle it rests on. */
export interface CriterionConformity {
  criterionId: string;
  outcome: ConformityOutcome;
  /** Null when no cycle was judged. */
  cycle: number | null;
  statement: string;
}

export interface RunVerdict {
  /** Did the run follow its procedure? "not decided" when some check could not be assessed and none deviates. */
  procedureFollowed: "yes" | "no" | "not decided";
  /** Does the specimen meet the requirement? Judged from the acceptance criteria alone. */
  specimenConforms: ConformityOutcome;
  /** Some step ran outside the cell's rating; the results are marked so (docs/references.md §12). */
  beyondRating: boolean;
  reasons: string[];
}

function locate(finding: Finding): string {
  if (finding.stepId === null) return "the run";
  return `step "${finding.stepId}"${finding.cycle !== null && finding.cycle > 1 ? `, cycle ${finding.cycle}` : ""}`;
}

function describeFinding(finding: Finding): string {
  return `${locate(finding)}: ${finding.title} — expected ${finding.expected.text}; observed ${finding.observed.text}`;
}

function decideProcedure(findings: readonly Finding[]): { outcome: RunVerdict["procedureFollowed"]; reasons: string[] } {
  const deviating = findings.filter((finding) => finding.outcome === "deviates");
  if (deviating.length > 0) {
    const count = `${deviating.length} check${deviating.length === 1 ? "" : "s"}`;
    return { outcome: "no", reasons: [`Procedure not followed: ${count} deviate${deviating.length === 1 ? "s" : ""}.`, ...deviating.map((f) => `Deviates — ${describeFinding(f)}`)] };
  }
  const open = findings.filter((finding) => finding.outcome === "not assessable");
  if (open.length > 0) {
    const count = `${open.length} check${open.length === 1 ? "" : "s"}`;
    return { outcome: "not decided", reasons: [`Whether the procedure was followed is not decided: ${count} could not be assessed, none deviates.`, ...open.map((f) => `Not assessable — ${describeFinding(f)}`)] };
  }
  return { outcome: "yes", reasons: [`Procedure followed: all ${findings.length} checks meet.`] };
}

/**
 * The specimen's statement from its criteria, the least favourable first: a failure decides; then a
 * conditional fail (ILAC-G8:09/2019 4.2.3); then an open question leaves it undecided; then a
 * conditional pass; only when every criterion conforms does the specimen conform.
 */
const worstFirst: readonly ConformityOutcome[] = ["does not conform", "conditional fail", "not decided", "conditional pass"];
function combineConformity(conformity: readonly CriterionConformity[]): ConformityOutcome {
  return worstFirst.find((outcome) => conformity.some((entry) => entry.outcome === outcome)) ?? "conforms";
}

/**
 * The run's verdict keeps two questions apart: was the procedure followed (from the findings), and
 * does the specimen meet the requirement (from the acceptance criteria under the decision rule).
 * A report states deviations from the method beside its results (ISO/IEC 17025:2017 7.8.2.1), so
 * one answer does not overwrite the other.
 */
export function decideVerdict({
  findings,
  conformity,
  otherVersionNote,
}: {
  findings: readonly Finding[];
  conformity: readonly CriterionConformity[];
  /** Set when the run is judged against a procedure version other than the one it followed. */
  otherVersionNote: string | null;
}): RunVerdict {
  const procedure = decideProcedure(findings);
  const specimenConforms = conformity.length === 0 ? "not decided" : combineConformity(conformity);
  const specimenReasons =
    conformity.length === 0
      ? ["The procedure states no acceptance criterion, so no statement of conformity is made."]
      : [
          `Specimen: ${specimenConforms}.`,
          ...conformity.map((entry) => `Criterion "${entry.criterionId}"${entry.cycle !== null ? ` (cycle ${entry.cycle})` : ""}: ${entry.statement}`),
        ];
  const beyond = findings.filter((finding) => finding.beyondRating === true);
  const ratingReasons = beyond.length === 0 ? [] : [`Outside the cell's rating: ${beyond.map(locate).join("; ")}. The results are marked so.`];
  return {
    procedureFollowed: procedure.outcome,
    specimenConforms,
    beyondRating: beyond.length > 0,
    reasons: [...(otherVersionNote === null ? [] : [otherVersionNote]), ...procedure.reasons, ...specimenReasons, ...ratingReasons],
  };
}
