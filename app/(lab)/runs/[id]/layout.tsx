import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { z } from "zod";
import { RunTabs } from "@/components/runs/run-tabs";
import { SignatureList } from "@/components/signatures/signature-manifestation";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listRunSignatures } from "@/db/reviews";
import { getRunSummary } from "@/db/runs";
import { requireAreaAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";

/** The run's header with its signatures, and its views; loading boundaries sit inside each view. */
export default async function RunLayout({ children, params }: { children: ReactNode; params: Promise<{ id: string }> }) {
  const user = await requireAreaAccess("/runs/[id]");
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
            <TextLink href={`/procedures/${run.procedure.id}/versions/${run.procedure.number}`}>
              {run.procedure.code} version {run.procedure.number}
            </TextLink>{" "}
            ({run.procedure.title}) on specimen{" "}
            <TextLink href={`/specimens/${run.specimen.id}`}>
              {run.specimen.identifier}
            </TextLink>{" "}
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
