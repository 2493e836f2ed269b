import type { Metadata } from "next";
import { LotForm } from "@/components/specimens/lot-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageAccess } from "@/lib/auth/guards";
import { loadSpecificationOptions } from "@/lib/specimens/form-options";
import { saveLotAction } from "../actions";

export const metadata: Metadata = { title: "Register a lot" };

export default async function NewLotPage() {
  await requirePageAccess("/lots/new");
  return (
    <>
      <PageHeader title="Register a lot" lead="Record the delivery as it arrived; register the specimens drawn from it afterwards." />
      <LotForm action={saveLotAction} specifications={await loadSpecificationOptions()} />
    </>
  );
}
