import type { Metadata } from "next";
import { z } from "zod";
import { SpecimensTable } from "@/components/specimens/specimens-table";
import { ActionLink } from "@/components/ui/action-link";
import { TextSearch } from "@/components/ui/text-search";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listSpecimens } from "@/db/specimens";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Specimens" };

export default async function SpecimensPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/specimens");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const specimens = await listSpecimens(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Specimens"
        lead="Each cell the lab tests, with its own identifier, its cell specification, its lot and how it arrived."
        actions={
          can(user.role, "specimen.manage") && (
            <ActionLink href="/specimens/new">
              Register a specimen
            </ActionLink>
          )
        }
      />
      <TextSearch label="Specimen, lot, maker, model or condition" value={q} />
      <SpecimensTable specimens={specimens} />
    </>
  );
}
