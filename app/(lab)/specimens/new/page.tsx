import type { Metadata } from "next";
import { z } from "zod";
import { SpecimenForm } from "@/components/specimens/specimen-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageAccess } from "@/lib/auth/guards";
import { loadLotOptions, loadSpecificationOptions } from "@/lib/specimens/form-options";
import { saveSpecimenAction } from "../actions";

export const metadata: Metadata = { title: "Register a specimen" };

/** `?lot=<id>` (from a lot's page) starts the form in that lot; `&position=137` at that tray position (a drawn cell). */
export default async function NewSpecimenPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageAccess("/specimens/new");
  const query = await searchParams;
  const lotId = z.uuid().optional().catch(undefined).parse(query.lot);
  const position = z.coerce.number().int().min(1).optional().catch(undefined).parse(query.position);
  const [specifications, lots] = await Promise.all([loadSpecificationOptions(), loadLotOptions()]);
  const lot = lots.find((l) => l.id === lotId);
  return (
    <>
      <PageHeader title="Register a specimen" lead="One cell as it arrived. A specimen of a lot is always of the lot's cell specification." />
      <SpecimenForm
        action={saveSpecimenAction}
        specifications={specifications}
        lots={lots}
        initial={lot ? { lotId: lot.id, lotPosition: position ?? null, cellSpecificationId: lot.cellSpecificationId, receivedOn: lot.receivedOn } : undefined}
      />
    </>
  );
}
