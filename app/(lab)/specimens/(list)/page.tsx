import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { SpecimensTable } from "@/components/specimens/specimens-table";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listSpecimens } from "@/db/specimens";
import { requirePagePermission } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Specimens" };

export default async function SpecimensPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePagePermission("run.read");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const specimens = await listSpecimens(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Specimens"
        lead="Each cell the lab tests, with its own identifier, its cell specification, its lot and how it arrived."
        actions={
          can(user.role, "specimen.manage") && (
            <Link href="/specimens/new" className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
              Register a specimen
            </Link>
          )
        }
      />
      <form className="mb-4 flex items-end gap-2" role="search">
        <label className="flex flex-col text-sm">
          Specimen, lot, maker, model or condition
          <input name="q" defaultValue={q ?? ""} className="rounded border border-rule bg-white px-2 py-1.5" />
        </label>
        <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
          Show
        </button>
      </form>
      <SpecimensTable specimens={specimens} />
    </>
  );
}
