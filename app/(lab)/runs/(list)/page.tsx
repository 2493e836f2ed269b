import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listRuns } from "@/db/runs";
import type { RunStatus } from "@/db/schema";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

export const metadata: Metadata = { title: "Runs" };

const STATUSES = Object.keys(RUN_STATUS_WORDS) as RunStatus[];
const filterSchema = z.object({
  status: z.enum(STATUSES as [RunStatus, ...RunStatus[]]).optional().catch(undefined),
  mine: z.literal("1").optional().catch(undefined),
});

export default async function RunsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/runs");
  const filter = filterSchema.parse(await searchParams);
  const runs = await listRuns(getDb(), { status: filter.status, operatorId: filter.mine ? user.id : undefined });
  return (
    <>
      <PageHeader
        title="Runs"
        lead="Each run is one procedure version carried out on one specimen, with its set-points frozen when it was started."
        actions={
          can(user.role, "run.operate") && (
            <ActionLink href="/runs/new">
              Start a run
            </ActionLink>
          )
        }
      />
      <form className="mb-4 flex flex-wrap items-end gap-3" role="search">
        <label className="flex flex-col text-sm">
          Status
          <select name="status" defaultValue={filter.status ?? ""} className="rounded border border-rule bg-white px-2 py-1.5">
            <option value="">any</option>
            {STATUSES.map((s) => (
              <option key={s} value={s}>
                {RUN_STATUS_WORDS[s].words}
              </option>
            ))}
          </select>
        </label>
        {can(user.role, "run.operate") && (
          <label className="flex min-h-9 items-center gap-2 text-sm">
            <input type="checkbox" name="mine" value="1" defaultChecked={filter.mine === "1"} className="size-4 accent-copper" />
            Only runs I operated
          </label>
        )}
        <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
          Show
        </button>
      </form>
      <div className="overflow-x-auto">
        <table className="figures w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Run</th>
              <th className="py-2 pr-3">Procedure</th>
              <th className="py-2 pr-3">Specimen</th>
              <th className="py-2 pr-3">Operator</th>
              <th className="py-2 pr-3">Status</th>
              <th className="py-2">Planned on</th>
            </tr>
          </thead>
          <tbody>
            {runs.map((r) => (
              <tr key={r.id} className="border-b border-rule">
                <td className="py-2 pr-3">
                  <Link href={`/runs/${r.id}`} className="font-medium text-copper-deep underline">
                    {r.number}
                  </Link>
                </td>
                <td className="py-2 pr-3">
                  {r.procedure.code} v{r.procedure.number} <span className="text-ink-soft">{r.procedure.title}</span>
                </td>
                <td className="py-2 pr-3 font-mono">{r.specimen.identifier}</td>
                <td className="py-2 pr-3">{r.operator.name}</td>
                <td className="py-2 pr-3">
                  <span aria-hidden="true">{RUN_STATUS_WORDS[r.status].mark} </span>
                  {RUN_STATUS_WORDS[r.status].words}
                </td>
                <td className="py-2 whitespace-nowrap">{r.createdAt.toISOString().slice(0, 10)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {runs.length === 0 && <p className="py-6 text-ink-soft">No runs match.</p>}
      </div>
    </>
  );
}
