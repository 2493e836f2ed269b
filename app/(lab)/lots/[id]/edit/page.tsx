import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { LotForm } from "@/components/specimens/lot-form";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getLot } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { loadSpecificationOptions } from "@/lib/specimens/form-options";
import { saveLotAction } from "../../actions";

export const metadata: Metadata = { title: "Edit lot" };

export default async function EditLotPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/lots/[id]/edit");
  const id = z.uuid().safeParse((await params).id);
  const [lot, specifications] = await Promise.all([id.success ? getLot(getDb(), id.data) : null, loadSpecificationOptions()]);
  if (!lot) notFound();
  return (
    <>
      <PageHeader
        title={`Edit lot ${lot.identifier}`}
        lead={lot.specimenCount > 0 ? "Specimens are registered from this lot, so its cell specification stays as it is." : undefined}
      />
      <LotForm action={saveLotAction} specifications={specifications} initial={{ ...lot, cellSpecificationId: lot.specification.id }} />
    </>
  );
}
