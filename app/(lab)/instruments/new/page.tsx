import type { Metadata } from "next";
import { InstrumentForm } from "@/components/instruments/instrument-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageAccess } from "@/lib/auth/guards";
import { saveInstrumentAction } from "../actions";

export const metadata: Metadata = { title: "Register an instrument" };

export default async function NewInstrumentPage() {
  await requirePageAccess("/instruments/new");
  return (
    <>
      <PageHeader title="Register an instrument" lead="Copy the accuracy and the dates from the maker's data and the current calibration certificate." />
      <InstrumentForm action={saveInstrumentAction} />
    </>
  );
}
