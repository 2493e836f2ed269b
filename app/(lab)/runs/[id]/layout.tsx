import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { RunTabs } from "@/components/runs/run-tabs";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getRun } from "@/db/runs";
import { requirePagePermission } from "@/lib/auth/guards";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** The run's header and its three views; loading boundaries sit inside each view. */
export default async function RunLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  await requirePagePermission("run.read");
  const id = z.uuid().safeParse((await params).id);
  const run = id.success ? await getRun(getDb(), id.data) : null;
  if (!run) notFound();
  const status = RUN_STATUS_WORDS[run.status];
  return (
    <>
      <PageHeader
        title={`Run ${run.number}`}
        lead={
          <>
            <Link href={`/procedures/${run.procedure.id}/versions/${run.procedure.number}`} className="text-copper-deep underline">
              {run.procedure.code} version {run.procedure.number}
            </Link>{" "}
            ({run.procedure.title}) on specimen{" "}
            <Link href={`/specimens/${run.specimen.id}`} className="text-copper-deep underline">
              {run.specimen.identifier}
            </Link>{" "}
            · operator {run.operator.name} ·{" "}
            <span data-testid="run-status">
              <span aria-hidden="true">{status.mark} </span>
              {status.words}
            </span>
          </>
        }
      />
      <RunTabs runId={run.id} />
      {children}
    </>
  );
}
