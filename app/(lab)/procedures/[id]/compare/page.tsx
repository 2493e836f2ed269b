import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { requirePagePermission } from "@/lib/auth/guards";
import { canSeeVersion } from "@/lib/procedures/read-access";
import { compareProcedures, describeCriterion, describeStep, type ItemChange } from "@/protocols";

export const metadata: Metadata = { title: "Compare versions" };

const querySchema = z.object({ a: z.coerce.number<string>().int().min(1), b: z.coerce.number<string>().int().min(1) });

const CHANGE_WORDS: Record<ItemChange, string> = { added: "added", removed: "removed", changed: "changed", unchanged: "same" };
const CHANGE_STYLE: Record<ItemChange, string> = {
  added: "bg-white border-l-4 border-meets",
  removed: "bg-white border-l-4 border-deviates",
  changed: "bg-copper-wash border-l-4 border-copper",
  unchanged: "bg-paper",
};

export default async function ComparePage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePagePermission("procedure.read");
  const id = z.uuid().safeParse((await params).id);
  const q = querySchema.safeParse(await searchParams);
  if (!id.success) notFound();
  if (!q.success) {
    return <p>Choose two versions to compare on the <Link href={`/procedures/${id.data}`} className="text-copper-deep underline">procedure page</Link>.</p>;
  }
  const [a, b] = await Promise.all([getProcedureVersion(getDb(), id.data, q.data.a), getProcedureVersion(getDb(), id.data, q.data.b)]);
  if (!a || !b || !canSeeVersion(user, a.status) || !canSeeVersion(user, b.status)) notFound();
  const cmp = compareProcedures(a.definition, b.definition);
  return (
    <>
      <PageHeader
        title={`${a.code}: version ${a.number} beside version ${b.number}`}
        lead={cmp.identical ? "The two versions have the same content." : "What changed, step by step. Left: the earlier version; right: the later one."}
        actions={<Link href={`/procedures/${a.procedureId}`} className="text-sm text-copper-deep underline">All versions</Link>}
      />
      {cmp.headerChangedFields.length > 0 && (
        <p className="mb-4 text-sm">
          Header fields changed: <span className="font-mono">{cmp.headerChangedFields.join(", ")}</span>
        </p>
      )}
      <table className="w-full border-separate border-spacing-y-1 text-sm">
        <thead>
          <tr className="text-left">
            <th className="w-24 py-1">Step</th>
            <th className="py-1">Version {a.number}</th>
            <th className="py-1">Version {b.number}</th>
          </tr>
        </thead>
        <tbody>
          {cmp.steps.map((s) => (
            <tr key={`${s.stepId}-${s.change}`} className={CHANGE_STYLE[s.change]} data-testid={`step-${s.stepId}`}>
              <td className="p-2 align-top">
                <span className="font-mono text-xs">{s.stepId}</span>
                <br />
                <strong>{CHANGE_WORDS[s.change]}</strong>
                {s.moved && <span> (moved)</span>}
              </td>
              <td className="p-2 align-top">{s.before ? `${s.before.label}: ${describeStep(s.before)}` : "—"}</td>
              <td className="p-2 align-top">
                {s.after ? `${s.after.label}: ${describeStep(s.after)}` : "—"}
                {s.changedFields.length > 0 && <p className="mt-1 font-mono text-xs text-copper-deep">changed: {s.changedFields.join(", ")}</p>}
              </td>
            </tr>
          ))}
          <tr className={CHANGE_STYLE[cmp.decisionRule.change]} data-testid="decision-rule">
            <td className="p-2 align-top">
              decision rule
              <br />
              <strong>{CHANGE_WORDS[cmp.decisionRule.change]}</strong>
            </td>
            <td className="p-2 align-top">{cmp.decisionRule.before}</td>
            <td className="p-2 align-top">{cmp.decisionRule.after}</td>
          </tr>
          {cmp.acceptance.map((c) => (
            <tr key={`crit-${c.criterionId}-${c.change}`} className={CHANGE_STYLE[c.change]}>
              <td className="p-2 align-top">
                criterion <span className="font-mono text-xs">{c.criterionId}</span>
                <br />
                <strong>{CHANGE_WORDS[c.change]}</strong>
              </td>
              <td className="p-2 align-top">{c.before ? describeCriterion(c.before) : "—"}</td>
              <td className="p-2 align-top">{c.after ? describeCriterion(c.after) : "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
