import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecForm } from "@/components/specs/spec-form";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getCellSpecification } from "@/db/cell-specifications";
import { requirePageAccess } from "@/lib/auth/guards";
import { saveSpecificationAction } from "../../actions";

export const metadata: Metadata = { title: "Edit cell specification" };

export default async function EditSpecPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/specs/[id]/edit");
  const id = z.uuid().safeParse((await params).id);
  const spec = id.success ? await getCellSpecification(getDb(), id.data) : null;
  if (!spec) notFound();
  return (
    <>
      <PageHeader
        title={`Edit ${spec.maker} ${spec.model}`}
        lead="Runs already started keep the set-points they were started with; only new runs use the changed values."
      />
      <SpecForm action={saveSpecificationAction} initial={spec} />
    </>
  );
}
