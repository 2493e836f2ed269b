import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProcedures } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { procedureTemplates } from "@/protocols";
import { NewProcedureForm, type StartOption } from "./new-procedure-form";
import { BLANK_START } from "./start-procedure";

export const metadata: Metadata = { title: "New procedure" };

export default async function NewProcedurePage() {
  await requirePageAccess("/procedures/new");
  const existingCodes = (await listProcedures(getDb())).map((p) => p.code);
  const options: StartOption[] = [
    ...procedureTemplates.map(({ key, procedure: { header, steps } }) => ({
      key,
      title: header.title,
      standard: header.standard,
      clause: header.clause,
      scope: header.scope,
      stepCount: steps.length,
    })),
    {
      key: BLANK_START,
      title: "Blank procedure",
      standard: "",
      clause: "",
      scope: "One rest step and placeholder header values, for a procedure no template comes close to.",
      stepCount: 1,
    },
  ];
  return (
    <>
      <PageHeader
        title="New procedure"
        lead="Start from a built-in template or from a blank procedure. You edit everything on the next page; nothing runs until a second engineer releases it."
        actions={
          <TextLink href="/procedures" className="text-sm">
            All procedures
          </TextLink>
        }
      />
      <NewProcedureForm options={options} existingCodes={existingCodes} />
    </>
  );
}
