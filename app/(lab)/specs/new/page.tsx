import type { Metadata } from "next";
import { SpecForm } from "@/components/specs/spec-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageAccess } from "@/lib/auth/guards";
import { saveSpecificationAction } from "../actions";

export const metadata: Metadata = { title: "New cell specification" };

export default async function NewSpecPage() {
  await requirePageAccess("/specs/new");
  return (
    <>
      <PageHeader title="New cell specification" lead="Copy the values from the maker's datasheet. Procedures take their currents and voltages from here." />
      <SpecForm action={saveSpecificationAction} />
    </>
  );
}
