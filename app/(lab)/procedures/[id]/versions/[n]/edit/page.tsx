import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ProcedureEditor } from "@/components/procedure-editor";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { describeStatus } from "@/lib/procedures/lifecycle";
import { requirePageAccess } from "@/lib/auth/guards";
import { saveDraftAction } from "./actions";
import { loadVersionForEdit } from "./load-version";

export const metadata: Metadata = { title: "Edit procedure" };

export default async function EditVersionPage({ params }: { params: Promise<{ id: string; n: string }> }) {
  await requirePageAccess("/procedures/[id]/versions/[n]/edit");
  const { id, n } = await params;
  const v = await loadVersionForEdit(id, n);
  if (!v) notFound();
  const versionHref = `/procedures/${v.procedureId}/versions/${v.number}`;
  const back = (
    <TextLink href={versionHref} className="text-sm">
      Version {v.number} of {v.code}
    </TextLink>
  );
  if (v.status !== "draft") {
    return (
      <>
        <PageHeader title={`Edit ${v.title}`} actions={back} />
        <p className="rounded border border-rule bg-paper-deep p-4" role="note">
          Version {v.number} of <span className="font-mono">{v.code}</span> is {describeStatus(v.status)}, so it cannot be edited. Only a draft can
          be edited: read it on{" "}
          <TextLink href={versionHref}>
            the version page
          </TextLink>
          , or start a new draft from it on{" "}
          <TextLink href={`/procedures/${v.procedureId}`}>
            the procedure&apos;s page
          </TextLink>
          .
        </p>
      </>
    );
  }
  return (
    <>
      <PageHeader
        title={`Edit ${v.title}`}
        lead={
          <>
            <span className="font-mono">{v.code}</span> · version {v.number} · draft. Changes are kept when you save; submit for review from the
            procedure&apos;s page.
          </>
        }
        actions={back}
      />
      <ProcedureEditor
        procedureId={v.procedureId}
        number={v.number}
        initial={{ definition: v.definition, instructions: v.instructions, cautions: v.cautions, acknowledgedCautions: v.acknowledgedCautions }}
        save={saveDraftAction}
      />
    </>
  );
}
