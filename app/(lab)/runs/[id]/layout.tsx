import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { RunTabs } from "@/components/runs/run-tabs";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";
import { SignatureList } from "@/components/signatures/signature-manifestation";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listRunSignatures } from "@/db/reviews";
import { getRunSummary } from "@/db/runs";
import { requirePagePermission } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** The run's header with its signatures, and its views; loading boundaries sit inside each view. */
export default async function RunLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  const user = await requirePagePermission("run.read");
  const id = z.uuid().safeParse((await params).id);
  const [run, signatures] = id.success ? await Promise.all([getRunSummary(getDb(), id.data), listRunSignatures(getDb(), id.data)]) : [null, []];
  if (!run) notFound();
  const status = RUN_STATUS_WORDS[run.status];
  return (
    <>
      <PageHeader
        title={`Run ${run.number}`}
        lead={
          <>
            <HoverPrefetchLink href={`/procedures/${run.procedure.id}/versions/${run.procedure.number}`} className="text-copper-deep underline">
              {run.procedure.code} version {run.procedure.number}
            </HoverPrefetchLink>{" "}
            ({run.procedure.title}) on specimen{" "}
            <HoverPrefetchLink href={`/specimens/${run.specimen.id}`} className="text-copper-deep underline">
              {run.specimen.identifier}
            </HoverPrefetchLink>{" "}
            · operator {run.operator.name} ·{" "}
            <span data-testid="run-status">
              <span aria-hidden="true">{status.mark} </span>
              {status.words}
            </span>
          </>
        }
      />
      {/* 21 CFR 11.50: a signed record shows who signed, when and what it meant, wherever it is shown. */}
      <SignatureList signatures={signatures} className="-mt-3 mb-4 flex flex-col gap-1 text-sm" />
      {/* Engineers review; the run's operator sees there why they may not. */}
      <RunTabs runId={run.id} showReview={can(user.role, "run.review") || run.operator.id === user.id} />
      {children}
    </>
  );
}
