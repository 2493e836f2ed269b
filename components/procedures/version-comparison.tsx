import { describeInnerPath } from "@/components/procedure-editor/field-paths";
import { Table } from "@/components/ui/table";
import { compareProcedures, describeCriterion, describeRetentionSetting, describeStep, type ItemChange, type Procedure } from "@/protocols";

const CHANGE_WORDS: Record<ItemChange, string> = { added: "added", removed: "removed", changed: "changed", unchanged: "same" };
const CHANGE_STYLE: Record<ItemChange, string> = {
  added: "bg-white border-l-4 border-meets",
  removed: "bg-white border-l-4 border-deviates",
  changed: "bg-copper-wash border-l-4 border-copper",
  unchanged: "bg-paper",
};

const words = (paths: readonly string[]) => paths.map(describeInnerPath).join(", ");

/** What changed between two versions, step by step, in words: left the earlier one, right the later one. */
export function VersionComparison({ before, after }: { before: { number: number; definition: Procedure }; after: { number: number; definition: Procedure } }) {
  const cmp = compareProcedures(before.definition, after.definition);
  return (
    <div className="flex flex-col gap-3" data-testid="version-comparison">
      <p className="text-sm">{cmp.identical ? "The two versions have the same content." : "What changed, step by step. Left: the earlier version; right: the later one."}</p>
      {cmp.headerChangedFields.length > 0 && <p className="text-sm">Header fields changed: {words(cmp.headerChangedFields)}</p>}
      <Table className="border-separate border-spacing-y-1">
        <thead>
          <tr className="text-left">
            <th scope="col" className="w-28 py-1">Step</th>
            <th scope="col" className="py-1">Version {before.number}</th>
            <th scope="col" className="py-1">Version {after.number}</th>
          </tr>
        </thead>
        <tbody>
          {cmp.steps.map((s) => (
            <tr key={`${s.stepId}-${s.change}`} className={CHANGE_STYLE[s.change]} data-testid={`step-${s.stepId}`}>
              <td className="p-2 align-top">
                Step {(s.afterIndex ?? s.beforeIndex ?? 0) + 1}
                <br />
                <strong>{CHANGE_WORDS[s.change]}</strong>
                {s.moved && <span> (moved)</span>}
              </td>
              <td className="p-2 align-top">{s.before ? `${s.before.label}: ${describeStep(s.before)}` : "—"}</td>
              <td className="p-2 align-top">
                {s.after ? `${s.after.label}: ${describeStep(s.after)}` : "—"}
                {s.changedFields.length > 0 && <p className="mt-1 text-xs text-copper-deep">changed: {words(s.changedFields)}</p>}
              </td>
            </tr>
          ))}
          <tr className={CHANGE_STYLE[cmp.decisionRule.change]} data-testid="decision-rule">
            <td className="p-2 align-top">
              Decision rule
              <br />
              <strong>{CHANGE_WORDS[cmp.decisionRule.change]}</strong>
            </td>
            <td className="p-2 align-top">{cmp.decisionRule.before}</td>
            <td className="p-2 align-top">{cmp.decisionRule.after}</td>
          </tr>
          {(cmp.retention.before || cmp.retention.after) && (
            <tr className={CHANGE_STYLE[cmp.retention.change]} data-testid="retention-setting">
              <td className="p-2 align-top">
                Retention and recovery
                <br />
                <strong>{CHANGE_WORDS[cmp.retention.change]}</strong>
              </td>
              <td className="p-2 align-top">{cmp.retention.before ? describeRetentionSetting(cmp.retention.before, before.definition.steps) : "—"}</td>
              <td className="p-2 align-top">{cmp.retention.after ? describeRetentionSetting(cmp.retention.after, after.definition.steps) : "—"}</td>
            </tr>
          )}
          {cmp.acceptance.map((c, i) => (
            <tr key={`crit-${c.criterionId}-${c.change}`} className={CHANGE_STYLE[c.change]}>
              <td className="p-2 align-top">
                Criterion {i + 1}
                <br />
                <strong>{CHANGE_WORDS[c.change]}</strong>
              </td>
              <td className="p-2 align-top">{c.before ? describeCriterion(c.before, before.definition.steps) : "—"}</td>
              <td className="p-2 align-top">{c.after ? describeCriterion(c.after, after.definition.steps) : "—"}</td>
            </tr>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
