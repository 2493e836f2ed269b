import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecimenForm } from "@/components/specimens/specimen-form";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getSpecimen } from "@/db/specimens";
import { requirePageAccess } from "@/lib/auth/guards";
import { loadLotOptions, loadSpecificationOptions } from "@/lib/specimens/form-options";
import { saveSpecimenAction } from "../../actions";

export const metadata: Metadata = { title: "Edit specimen" };

export default async function EditSpecimenPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/specimens/[id]/edit");
  const id = z.uuid().safeParse((await params).id);
  const [specimen, specifications, lots] = await Promise.all([
    id.success ? getSpecimen(getDb(), id.data) : null,
    loadSpecificationOptions(),
    loadLotOptions(),
  ]);
  if (!specimen) notFound();
  return (
    <>
      <PageHeader title={`Edit specimen ${specimen.identifier}`} />
      <SpecimenForm
        action={saveSpecimenAction}
        specifications={specifications}
        lots={lots}
        initial={{
          id: specimen.id,
          identifier: specimen.identifier,
          cellSpecificationId: specimen.specification.id,
          lotId: specimen.lot?.id ?? null,
          lotPosition: specimen.lotPosition,
          receivedOn: specimen.receivedOn,
          conditionOnReceipt: specimen.conditionOnReceipt,
          notes: specimen.notes,
        }}
      />
    </>
  );
}
