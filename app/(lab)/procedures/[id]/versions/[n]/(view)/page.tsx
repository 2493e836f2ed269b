import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ProcedureDefinitionView } from "@/components/procedures/procedure-definition-view";
import { StatusBadge } from "@/components/procedures/status-badge";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { getProcedureVersion } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { canSeeVersion } from "@/lib/procedures/read-access";
import { versionParamsSchema } from "@/lib/procedures/version-params";
import { VersionPreview } from "./version-preview";

export const metadata: Metadata = { title: "Procedure version" };

export default async function ProcedureVersionPage({ params }: { params: Promise<{ id: string; n: string }> }) {
  const user = await requirePageAccess("/procedures/[id]/versions/[n]");
  const parsed = versionParamsSchema.safeParse(await params);
  if (!parsed.success) notFound();
  const v = await getProcedureVersion(getDb(), parsed.data.id, parsed.data.n);
  if (!v || !canSeeVersion(user, v.status)) notFound();
  return (
    <>
      <PageHeader
        title={v.title}
        lead={
          <>
            <span className="font-mono">{v.code}</span> · version {v.number} <StatusBadge status={v.status} />
            {v.releasedBy && ` · released by ${v.releasedBy.name} on ${v.releasedBy.at.toISOString().slice(0, 10)}`}
          </>
        }
        actions={
          <TextLink href={`/procedures/${v.procedureId}`} className="text-sm">
            All versions of {v.code}
          </TextLink>
        }
      />
      {v.status !== "released" && (
        <p className="mb-4 rounded border border-rule bg-paper-deep p-3 text-sm" role="note">
          {v.status === "withdrawn" ? "This version is withdrawn: it is kept for the record and cannot be run." : "This version is not released: it cannot be run yet."}
        </p>
      )}
      <ProcedureDefinitionView definition={v.definition} instructions={v.instructions} cautions={v.cautions} acknowledgedCautions={v.acknowledgedCautions} />
      <VersionPreview procedureId={v.procedureId} number={v.number} />
    </>
  );
}
