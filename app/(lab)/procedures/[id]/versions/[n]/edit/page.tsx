import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ProcedureEditor } from "@/components/procedure-editor";
import { PageHeader } from "@/components/ui/page-header";
import { describeStatus } from "@/lib/procedures/lifecycle";
import { requirePagePermission } from "@/lib/auth/guards";
import { saveDraftAction } from "./actions";
import { loadVersionForEdit } from "./load-version";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

export const metadata: Metadata = { title: "Edit procedure" };

export default async function EditVersionPage({ params }: { params: Promise<{ id: string; n: string }> }) {
  await requirePagePermission("procedure.author");
  const { id, n } = await params;
  const v = await loadVersionForEdit(id, n);
  if (!v) notFound();
  const versionHref = `/procedures/${v.procedureId}/versions/${v.number}`;
  const back = (
    <HoverPrefetchLink href={versionHref} className="text-sm text-copper-deep underline">
      Version {v.number} of {v.code}
    </HoverPrefetchLink>
  );
  if (v.status !== "draft") {
    return (
      <>
        <PageHeader title={`Edit ${v.title}`} actions={back} />
        <p className="rounded border border-rule bg-paper-deep p-4" role="note">
          Version {v.number} of <span className="font-mono">{v.code}</span> is {describeStatus(v.status)}, so it cannot be edited. Only a draft can
          be edited: read it on{" "}
          <HoverPrefetchLink href={versionHref} className="text-copper-deep underline">
            the version page
          </HoverPrefetchLink>
          , or start a new draft from it on{" "}
          <HoverPrefetchLink href={`/procedures/${v.procedureId}`} className="text-copper-deep underline">
            the procedure&apos;s page
          </HoverPrefetchLink>
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
