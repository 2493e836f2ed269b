import type { Finding, FindingOutcome, RunEvaluation } from "@/lib/conformance";

/** One finding as the results page shows it: words only, no numbers behind them. */
export interface FindingLine {
  id: string;
  title: string;
  outcome: FindingOutcome;
  /** A safety check (docs/design.md §7). */
  safety: boolean;
  /** The step ran outside the cell's rating by acknowledgement: never shown as a plain "meets". */
  beyondRating: boolean;
  expected: string;
  observed: string;
  clause: string;
}

/** The findings of the run as a whole, or of one step in one cycle, with how many of each outcome. */
export interface FindingGroup {
  /** "run", or "<step id>#<cycle>": names the group in a request for its findings. */
  key: string;
  label: string;
  counts: Record<FindingOutcome, number>;
  /** Something a reviewer must look at: a deviation, a check that could not be made, a step beyond the rating. */
  needsAttention: boolean;
  findings: FindingLine[];
}

const toLine = (f: Finding): FindingLine => ({
  id: f.id,
  title: f.title,
  outcome: f.outcome,
  safety: f.severity === "caution",
  beyondRating: f.beyondRating === true,
  expected: f.expected.text,
  observed: f.observed.text,
  clause: f.clause,
});

function toGroup(key: string, label: string, findings: Finding[]): FindingGroup {
  const counts: Record<FindingOutcome, number> = { meets: 0, deviates: 0, "not assessable": 0 };
  for (const f of findings) counts[f.outcome] += 1;
  return {
    key,
    label,
    counts,
    needsAttention: counts.deviates > 0 || counts["not assessable"] > 0 || findings.some((f) => f.beyondRating),
    findings: findings.map(toLine),
  };
}

/**
 * The evaluation's findings grouped in run order: the run as a whole first, then each step of each cycle.
 * Steps without findings are left out; no finding is left out or counted twice.
 */
export function groupFindings(evaluation: Pick<RunEvaluation, "runFindings" | "steps">): FindingGroup[] {
  const groups: FindingGroup[] = [];
  if (evaluation.runFindings.length > 0) groups.push(toGroup("run", "The run as a whole", evaluation.runFindings));
  for (const step of evaluation.steps) {
    if (step.findings.length === 0) continue;
    groups.push(toGroup(`${step.stepId}#${step.cycle}`, step.cycle > 1 ? `${step.label} (cycle ${step.cycle})` : step.label, step.findings));
  }
  return groups;
}

/** "14 checks: 13 meet, 1 deviates" — the words of a group's (or the whole evaluation's) summary line. */
export function describeCounts(counts: Record<FindingOutcome, number>): string {
  const total = counts.meets + counts.deviates + counts["not assessable"];
  const parts = [
    counts.meets > 0 ? `${counts.meets} ${counts.meets === 1 ? "meets" : "meet"}` : null,
    counts.deviates > 0 ? `${counts.deviates} ${counts.deviates === 1 ? "deviates" : "deviate"}` : null,
    counts["not assessable"] > 0 ? `${counts["not assessable"]} not assessable` : null,
  ].filter((p) => p !== null);
  return `${total} ${total === 1 ? "check" : "checks"}: ${parts.join(", ")}`;
}

/** The counts of all groups together. */
export function addCounts(groups: readonly FindingGroup[]): Record<FindingOutcome, number> {
  const sum: Record<FindingOutcome, number> = { meets: 0, deviates: 0, "not assessable": 0 };
  for (const g of groups) for (const k of Object.keys(sum) as FindingOutcome[]) sum[k] += g.counts[k];
  return sum;
}
