import { addCounts, describeCounts, type FindingGroup } from "@/lib/runs/group-findings";
import { FindingGroupDetails, type LoadFindingGroup } from "./finding-group-details";

/**
 * The evaluation's findings, one line per step in run order with how many checks met or deviated. Groups
 * with something to look at (a deviation, a check that could not be made, a step beyond the rating) are
 * open; the others open on demand.
 */
export function FindingGroups({ runId, evaluationId, groups, load }: { runId: string; evaluationId: string; groups: FindingGroup[]; load: LoadFindingGroup }) {
  if (groups.length === 0) return <p className="text-sm text-ink-soft">This evaluation has no findings.</p>;
  const all = addCounts(groups);
  return (
    <div className="flex flex-col gap-2" data-testid="findings">
      <p className="text-sm" data-testid="findings-summary">
        {describeCounts(all)}.{" "}
        {groups.some((g) => g.needsAttention) ? "Steps with something to look at are open; open any other step for its checks." : "Open a step for its checks."}
      </p>
      {groups.map((g) => (
        <FindingGroupDetails
          key={g.key}
          runId={runId}
          evaluationId={evaluationId}
          groupKey={g.key}
          lines={g.needsAttention ? g.findings : null}
          load={load}
          summary={
            <>
              <span className="font-medium">{g.label}</span>
              <span className="text-ink-soft"> — </span>
              <span className={g.counts.deviates > 0 ? "text-deviates" : g.counts["not assessable"] > 0 ? "text-ink-soft" : "text-meets"}>
                <span aria-hidden="true">{g.counts.deviates > 0 ? "✕ " : g.counts["not assessable"] > 0 ? "? " : "✓ "}</span>
                {describeCounts(g.counts)}
              </span>
            </>
          }
        />
      ))}
    </div>
  );
}
