import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { InstrumentForm } from "@/components/instruments/instrument-form";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getInstrument } from "@/db/instruments";
import { requirePageAccess } from "@/lib/auth/guards";
import { saveInstrumentAction } from "../../actions";

export const metadata: Metadata = { title: "Edit instrument" };

export default async function EditInstrumentPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/instruments/[id]/edit");
  const id = z.uuid().safeParse((await params).id);
  const instrument = id.success ? await getInstrument(getDb(), id.data) : null;
  if (!instrument) notFound();
  return (
    <>
      <PageHeader
        title={`Edit ${instrument.identifier}`}
        lead="After a recalibration, enter the new certificate number and dates. The audit trail keeps the earlier values."
      />
      <InstrumentForm action={saveInstrumentAction} initial={instrument} />
    </>
  );
}
